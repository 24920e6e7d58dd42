CREATE TYPE "public"."field_tenure" AS ENUM('owned', 'cash-rented');--> statement-breakpoint
CREATE TYPE "public"."person_role" AS ENUM('operator', 'partner', 'family', 'hired');--> statement-breakpoint
CREATE TABLE "people" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"farm_id" uuid NOT NULL,
	"key" text NOT NULL,
	"name" text NOT NULL,
	"role" "person_role" NOT NULL,
	"hours_available_by_month" jsonb NOT NULL,
	"wage_usd_per_hour" numeric(8, 2),
	"notes" text DEFAULT '' NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "fields" ADD COLUMN "tenure" "field_tenure" DEFAULT 'owned' NOT NULL;--> statement-breakpoint
ALTER TABLE "fields" ADD COLUMN "cash_rent_usd_per_acre" numeric(8, 2) DEFAULT 0 NOT NULL;--> statement-breakpoint
ALTER TABLE "field_operations" ADD COLUMN "copied_from" text;--> statement-breakpoint
ALTER TABLE "people" ADD CONSTRAINT "people_farm_id_farms_id_fk" FOREIGN KEY ("farm_id") REFERENCES "public"."farms"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "people_farm_id_key_index" ON "people" USING btree ("farm_id","key");