CREATE TYPE "public"."clock_style" AS ENUM('12h', '24h');--> statement-breakpoint
CREATE TYPE "public"."length_unit" AS ENUM('ft', 'm');--> statement-breakpoint
CREATE TYPE "public"."speed_unit" AS ENUM('mph', 'kmh', 'knots');--> statement-breakpoint
CREATE TYPE "public"."temperature_unit" AS ENUM('F', 'C');--> statement-breakpoint
CREATE TABLE "user_settings" (
	"user_id" uuid PRIMARY KEY NOT NULL,
	"temperature" "temperature_unit" DEFAULT 'F' NOT NULL,
	"length" "length_unit" DEFAULT 'ft' NOT NULL,
	"speed" "speed_unit" DEFAULT 'mph' NOT NULL,
	"clock" "clock_style" DEFAULT '12h' NOT NULL,
	"home_lake_id" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "user_settings" ADD CONSTRAINT "user_settings_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "user_settings" ADD CONSTRAINT "user_settings_home_lake_id_lakes_id_fk" FOREIGN KEY ("home_lake_id") REFERENCES "public"."lakes"("id") ON DELETE set null ON UPDATE no action;