CREATE TYPE "public"."brief_send_status" AS ENUM('sending', 'sent', 'retry', 'failed');--> statement-breakpoint
CREATE TABLE "brief_sends" (
	"user_id" uuid NOT NULL,
	"local_date" date NOT NULL,
	"status" "brief_send_status" NOT NULL,
	"attempts" integer DEFAULT 1 NOT NULL,
	"lease_until" timestamp with time zone,
	"next_attempt_at" timestamp with time zone,
	"sent_at" timestamp with time zone,
	"message_id" text,
	"last_error" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "brief_sends_user_id_local_date_pk" PRIMARY KEY("user_id","local_date")
);
--> statement-breakpoint
CREATE TABLE "brief_settings" (
	"user_id" uuid PRIMARY KEY NOT NULL,
	"enabled" boolean DEFAULT true NOT NULL,
	"send_time" time DEFAULT '05:00' NOT NULL,
	"days" smallint[] DEFAULT '{1,2,3,4,5,6,7}' NOT NULL,
	"time_zone" text NOT NULL,
	"temperature" "temperature_unit" DEFAULT 'F' NOT NULL,
	"length" "length_unit" DEFAULT 'ft' NOT NULL,
	"speed" "speed_unit" DEFAULT 'mph' NOT NULL,
	"clock" "clock_style" DEFAULT '12h' NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "users" ADD COLUMN "email_verified_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "brief_sends" ADD CONSTRAINT "brief_sends_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "brief_settings" ADD CONSTRAINT "brief_settings_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "brief_sends_open_idx" ON "brief_sends" USING btree ("status","next_attempt_at") WHERE "brief_sends"."status" <> 'sent';