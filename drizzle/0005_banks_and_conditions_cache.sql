CREATE TYPE "public"."bank_slope" AS ENUM('flat', 'gradual', 'steep', 'drop-off');--> statement-breakpoint
CREATE TABLE "banks" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"user_id" uuid NOT NULL,
	"lake_id" uuid NOT NULL,
	"name" text NOT NULL,
	"points" jsonb NOT NULL,
	"cover" text[] NOT NULL,
	"depth_m" double precision,
	"slope" "bank_slope",
	"notes" text DEFAULT '' NOT NULL,
	"exposure" jsonb NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "lake_days" (
	"lake_id" uuid NOT NULL,
	"date" date NOT NULL,
	"day" jsonb NOT NULL,
	"computed_at" timestamp with time zone NOT NULL,
	CONSTRAINT "lake_days_lake_id_date_pk" PRIMARY KEY("lake_id","date")
);
--> statement-breakpoint
CREATE TABLE "lake_reads" (
	"lake_id" uuid PRIMARY KEY NOT NULL,
	"read" jsonb NOT NULL,
	"computed_at" timestamp with time zone NOT NULL,
	"flags_hold_until" timestamp with time zone
);
--> statement-breakpoint
ALTER TABLE "banks" ADD CONSTRAINT "banks_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "banks" ADD CONSTRAINT "banks_lake_id_lakes_id_fk" FOREIGN KEY ("lake_id") REFERENCES "public"."lakes"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "lake_days" ADD CONSTRAINT "lake_days_lake_id_lakes_id_fk" FOREIGN KEY ("lake_id") REFERENCES "public"."lakes"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "lake_reads" ADD CONSTRAINT "lake_reads_lake_id_lakes_id_fk" FOREIGN KEY ("lake_id") REFERENCES "public"."lakes"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "banks_user_lake_name_key" ON "banks" USING btree ("user_id","lake_id","name");