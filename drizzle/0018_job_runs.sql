CREATE TABLE "job_runs" (
	"job" text NOT NULL,
	"slot" timestamp with time zone NOT NULL,
	"runner" text NOT NULL,
	"attempts" integer DEFAULT 1 NOT NULL,
	"started_at" timestamp with time zone DEFAULT now() NOT NULL,
	"finished_at" timestamp with time zone,
	CONSTRAINT "job_runs_job_slot_pk" PRIMARY KEY("job","slot")
);
