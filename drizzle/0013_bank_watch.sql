CREATE TYPE "public"."watch_alert_status" AS ENUM('sending', 'retry', 'sent', 'failed');--> statement-breakpoint
CREATE TYPE "public"."watch_kind" AS ENUM('angler', 'trip');--> statement-breakpoint
CREATE TABLE "push_subscriptions" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"user_id" uuid NOT NULL,
	"endpoint" text NOT NULL,
	"p256dh" text NOT NULL,
	"auth" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "watch_alerts" (
	"watch_id" uuid NOT NULL,
	"date" date NOT NULL,
	"window_id" text NOT NULL,
	"episode" integer NOT NULL,
	"match" jsonb NOT NULL,
	"status" "watch_alert_status" NOT NULL,
	"attempts" integer DEFAULT 1 NOT NULL,
	"delivered" text[] DEFAULT '{}' NOT NULL,
	"lease_until" timestamp with time zone,
	"next_attempt_at" timestamp with time zone,
	"sent_at" timestamp with time zone,
	"last_error" text,
	"cleared_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "watch_alerts_watch_id_date_window_id_episode_pk" PRIMARY KEY("watch_id","date","window_id","episode")
);
--> statement-breakpoint
CREATE TABLE "watches" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"user_id" uuid NOT NULL,
	"lake_id" uuid NOT NULL,
	"bank_id" uuid,
	"trip_id" uuid,
	"kind" "watch_kind" DEFAULT 'angler' NOT NULL,
	"name" text NOT NULL,
	"conditions" jsonb NOT NULL,
	"channels" text[] NOT NULL,
	"active" boolean DEFAULT true NOT NULL,
	"episodes" jsonb DEFAULT '{}'::jsonb NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "push_subscriptions" ADD CONSTRAINT "push_subscriptions_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "watch_alerts" ADD CONSTRAINT "watch_alerts_watch_id_watches_id_fk" FOREIGN KEY ("watch_id") REFERENCES "public"."watches"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "watches" ADD CONSTRAINT "watches_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "watches" ADD CONSTRAINT "watches_lake_id_lakes_id_fk" FOREIGN KEY ("lake_id") REFERENCES "public"."lakes"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "watches" ADD CONSTRAINT "watches_bank_id_banks_id_fk" FOREIGN KEY ("bank_id") REFERENCES "public"."banks"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "watches" ADD CONSTRAINT "watches_trip_id_trips_id_fk" FOREIGN KEY ("trip_id") REFERENCES "public"."trips"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "push_subscriptions_endpoint_key" ON "push_subscriptions" USING btree ("endpoint");--> statement-breakpoint
CREATE INDEX "push_subscriptions_user_idx" ON "push_subscriptions" USING btree ("user_id");--> statement-breakpoint
CREATE INDEX "watch_alerts_open_idx" ON "watch_alerts" USING btree ("status","next_attempt_at") WHERE "watch_alerts"."status" <> 'sent';--> statement-breakpoint
CREATE INDEX "watches_user_idx" ON "watches" USING btree ("user_id");--> statement-breakpoint
CREATE UNIQUE INDEX "watches_trip_key" ON "watches" USING btree ("trip_id");