CREATE TABLE "lake_recomputes" (
	"lake_id" uuid PRIMARY KEY NOT NULL,
	"total" integer NOT NULL,
	"done" integer DEFAULT 0 NOT NULL,
	"detached" integer DEFAULT 0 NOT NULL,
	"started_at" timestamp with time zone NOT NULL,
	"finished_at" timestamp with time zone,
	"error" text
);
--> statement-breakpoint
ALTER TABLE "banks" ADD COLUMN "detached_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "lake_recomputes" ADD CONSTRAINT "lake_recomputes_lake_id_lakes_id_fk" FOREIGN KEY ("lake_id") REFERENCES "public"."lakes"("id") ON DELETE cascade ON UPDATE no action;