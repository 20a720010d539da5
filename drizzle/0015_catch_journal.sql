-- Catch journal: each catch with the conditions attached at its time and place, and the photo
-- copies kept in object storage (keys only; location stripped before storing).
CREATE TYPE "public"."species" AS ENUM('largemouth', 'smallmouth', 'spotted', 'other');--> statement-breakpoint
CREATE TABLE "catch_photos" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"user_id" uuid NOT NULL,
	"catch_id" uuid,
	"display_key" text NOT NULL,
	"thumb_key" text NOT NULL,
	"width" integer NOT NULL,
	"height" integer NOT NULL,
	"bytes" integer NOT NULL,
	"taken_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "catches" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"user_id" uuid NOT NULL,
	"lake_id" uuid NOT NULL,
	"trip_id" uuid,
	"bank_id" uuid,
	"caught_at" timestamp with time zone NOT NULL,
	"species" "species" NOT NULL,
	"length_m" double precision,
	"weight_kg" double precision,
	"released" boolean NOT NULL,
	"lure" jsonb NOT NULL,
	"position" jsonb,
	"note" text DEFAULT '' NOT NULL,
	"conditions" jsonb,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "catch_photos" ADD CONSTRAINT "catch_photos_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "catch_photos" ADD CONSTRAINT "catch_photos_catch_id_catches_id_fk" FOREIGN KEY ("catch_id") REFERENCES "public"."catches"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "catches" ADD CONSTRAINT "catches_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "catches" ADD CONSTRAINT "catches_lake_id_lakes_id_fk" FOREIGN KEY ("lake_id") REFERENCES "public"."lakes"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "catches" ADD CONSTRAINT "catches_trip_id_trips_id_fk" FOREIGN KEY ("trip_id") REFERENCES "public"."trips"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "catches" ADD CONSTRAINT "catches_bank_id_banks_id_fk" FOREIGN KEY ("bank_id") REFERENCES "public"."banks"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "catch_photos_catch_idx" ON "catch_photos" USING btree ("catch_id");--> statement-breakpoint
CREATE INDEX "catch_photos_user_idx" ON "catch_photos" USING btree ("user_id");--> statement-breakpoint
CREATE INDEX "catches_user_caught_idx" ON "catches" USING btree ("user_id","caught_at" DESC NULLS LAST);--> statement-breakpoint
CREATE INDEX "catches_trip_idx" ON "catches" USING btree ("trip_id");