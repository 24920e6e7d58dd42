ALTER TABLE "plan_versions" ADD COLUMN "change_note" text DEFAULT '' NOT NULL;--> statement-breakpoint
ALTER TABLE "plan_versions" ADD COLUMN "restored_from_version" integer;