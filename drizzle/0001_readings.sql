CREATE TYPE "public"."parameter" AS ENUM('water_temp', 'gauge_height', 'turbidity', 'secchi');--> statement-breakpoint
CREATE TYPE "public"."quarantine_status" AS ENUM('held', 'released', 'discarded');--> statement-breakpoint
CREATE TYPE "public"."station_state" AS ENUM('ok', 'stale', 'failing');--> statement-breakpoint
CREATE TYPE "public"."weather_kind" AS ENUM('observed', 'forecast');--> statement-breakpoint
CREATE TABLE "datastreams" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"station_id" uuid NOT NULL,
	"parameter" "parameter" NOT NULL,
	"feed_datastream_id" text NOT NULL,
	"unit" text NOT NULL,
	"high_water_mark" timestamp with time zone,
	"backfill_cursor" timestamp with time zone
);
--> statement-breakpoint
CREATE TABLE "quarantine" (
	"id" bigserial PRIMARY KEY NOT NULL,
	"station_id" uuid,
	"lake_id" uuid,
	"parameter" text NOT NULL,
	"feed_id" text NOT NULL,
	"observed_at" timestamp with time zone,
	"raw" jsonb NOT NULL,
	"reason" text NOT NULL,
	"detail" text NOT NULL,
	"status" "quarantine_status" DEFAULT 'held' NOT NULL,
	"received_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "readings" (
	"station_id" uuid NOT NULL,
	"parameter" "parameter" NOT NULL,
	"observed_at" timestamp with time zone NOT NULL,
	"value" double precision NOT NULL,
	"original_value" double precision NOT NULL,
	"original_unit" text NOT NULL,
	"ingested_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "readings_station_id_parameter_observed_at_pk" PRIMARY KEY("station_id","parameter","observed_at")
);
--> statement-breakpoint
CREATE TABLE "stations" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"lake_id" uuid NOT NULL,
	"name" text NOT NULL,
	"feed_thing_id" text NOT NULL,
	"active" boolean DEFAULT true NOT NULL,
	"state" "station_state" DEFAULT 'stale' NOT NULL,
	"last_good_at" timestamp with time zone,
	"last_run_at" timestamp with time zone,
	"last_error" text,
	"gap_count" integer DEFAULT 0 NOT NULL,
	"rejected24h" integer DEFAULT 0 NOT NULL,
	"consecutive_failures" integer DEFAULT 0 NOT NULL,
	"circuit_open_until" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "weather_hours" (
	"lake_id" uuid NOT NULL,
	"kind" "weather_kind" NOT NULL,
	"at" timestamp with time zone NOT NULL,
	"issued_at" timestamp with time zone,
	"wind_ms" double precision NOT NULL,
	"gust_ms" double precision NOT NULL,
	"wind_from_deg" double precision NOT NULL,
	"air_c" double precision NOT NULL,
	"relative_humidity_pct" double precision NOT NULL,
	"pressure_hpa" double precision NOT NULL,
	"precipitation_mm" double precision NOT NULL,
	"cloud_cover_pct" double precision NOT NULL,
	"precipitation_probability_pct" double precision,
	"thunder_probability_pct" double precision,
	CONSTRAINT "weather_hours_lake_id_kind_at_pk" PRIMARY KEY("lake_id","kind","at")
);
--> statement-breakpoint
ALTER TABLE "datastreams" ADD CONSTRAINT "datastreams_station_id_stations_id_fk" FOREIGN KEY ("station_id") REFERENCES "public"."stations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "quarantine" ADD CONSTRAINT "quarantine_station_id_stations_id_fk" FOREIGN KEY ("station_id") REFERENCES "public"."stations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "quarantine" ADD CONSTRAINT "quarantine_lake_id_lakes_id_fk" FOREIGN KEY ("lake_id") REFERENCES "public"."lakes"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "readings" ADD CONSTRAINT "readings_station_id_stations_id_fk" FOREIGN KEY ("station_id") REFERENCES "public"."stations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "stations" ADD CONSTRAINT "stations_lake_id_lakes_id_fk" FOREIGN KEY ("lake_id") REFERENCES "public"."lakes"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "weather_hours" ADD CONSTRAINT "weather_hours_lake_id_lakes_id_fk" FOREIGN KEY ("lake_id") REFERENCES "public"."lakes"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "datastreams_station_parameter_key" ON "datastreams" USING btree ("station_id","parameter");--> statement-breakpoint
CREATE UNIQUE INDEX "datastreams_feed_id_key" ON "datastreams" USING btree ("feed_datastream_id");--> statement-breakpoint
CREATE UNIQUE INDEX "quarantine_source_feed_id_key" ON "quarantine" USING btree ("parameter","feed_id","reason");--> statement-breakpoint
CREATE INDEX "quarantine_station_received_idx" ON "quarantine" USING btree ("station_id","received_at");--> statement-breakpoint
CREATE INDEX "readings_station_latest_idx" ON "readings" USING btree ("station_id","observed_at" DESC NULLS LAST);--> statement-breakpoint
CREATE UNIQUE INDEX "stations_feed_thing_id_key" ON "stations" USING btree ("feed_thing_id");--> statement-breakpoint
CREATE INDEX "stations_lake_id_idx" ON "stations" USING btree ("lake_id");