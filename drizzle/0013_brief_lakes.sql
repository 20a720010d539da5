ALTER TABLE "subscriptions" ADD COLUMN "in_brief" boolean DEFAULT true NOT NULL;--> statement-breakpoint
-- One setting for units: a subscriber who chose units only for the brief keeps them as the account's.
INSERT INTO "user_settings" ("user_id", "temperature", "length", "speed", "clock")
SELECT "user_id", "temperature", "length", "speed", "clock" FROM "brief_settings"
ON CONFLICT ("user_id") DO NOTHING;--> statement-breakpoint
ALTER TABLE "brief_settings" DROP COLUMN "temperature";--> statement-breakpoint
ALTER TABLE "brief_settings" DROP COLUMN "length";--> statement-breakpoint
ALTER TABLE "brief_settings" DROP COLUMN "speed";--> statement-breakpoint
ALTER TABLE "brief_settings" DROP COLUMN "clock";
