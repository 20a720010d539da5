CREATE TABLE "subscriptions" (
	"user_id" uuid NOT NULL,
	"lake_id" uuid NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "subscriptions_user_id_lake_id_pk" PRIMARY KEY("user_id","lake_id")
);
--> statement-breakpoint
ALTER TABLE "subscriptions" ADD CONSTRAINT "subscriptions_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "subscriptions" ADD CONSTRAINT "subscriptions_lake_id_lakes_id_fk" FOREIGN KEY ("lake_id") REFERENCES "public"."lakes"("id") ON DELETE cascade ON UPDATE no action;