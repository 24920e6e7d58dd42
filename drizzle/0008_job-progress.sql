CREATE TABLE "job_progress" (
	"job_id" uuid PRIMARY KEY NOT NULL,
	"done" integer DEFAULT 0 NOT NULL,
	"total" integer NOT NULL,
	"starts" integer DEFAULT 1 NOT NULL,
	"worker" text NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
