CREATE TYPE "public"."farm_role" AS ENUM('owner', 'editor', 'reviewer');--> statement-breakpoint
CREATE TYPE "public"."fuel_basis" AS ENUM('per-acre', 'pto-power');--> statement-breakpoint
CREATE TYPE "public"."operation_by" AS ENUM('own', 'custom');--> statement-breakpoint
CREATE TYPE "public"."price_item_kind" AS ENUM('crop', 'seed-per-thousand-seeds', 'seed-per-lb', 'custom-rate-per-acre');--> statement-breakpoint
CREATE TYPE "public"."review_decision" AS ENUM('approved', 'changes_requested');--> statement-breakpoint
CREATE TYPE "public"."unit_system" AS ENUM('us', 'metric');--> statement-breakpoint
CREATE TABLE "accounts" (
	"user_id" uuid NOT NULL,
	"type" text NOT NULL,
	"provider" text NOT NULL,
	"provider_account_id" text NOT NULL,
	"refresh_token" text,
	"access_token" text,
	"expires_at" integer,
	"token_type" text,
	"scope" text,
	"id_token" text,
	"session_state" text,
	CONSTRAINT "accounts_provider_provider_account_id_pk" PRIMARY KEY("provider","provider_account_id")
);
--> statement-breakpoint
CREATE TABLE "audit_log" (
	"id" bigserial PRIMARY KEY NOT NULL,
	"farm_id" uuid,
	"user_id" uuid,
	"action" text NOT NULL,
	"detail" jsonb DEFAULT '{}'::jsonb NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "comments" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"plan_version_id" uuid NOT NULL,
	"author_id" uuid,
	"body" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "crop_practices" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"farm_id" uuid NOT NULL,
	"key" text NOT NULL,
	"name" text NOT NULL,
	"crop" text NOT NULL,
	"yield_goal_per_acre" numeric(10, 2) NOT NULL,
	"other_fertiliser_usd_per_acre" numeric(8, 2) NOT NULL,
	"chemicals_usd_per_acre" numeric(8, 2) NOT NULL,
	"other_direct_usd_per_acre" numeric(8, 2) NOT NULL,
	"detail" jsonb NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "farms" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"name" text NOT NULL,
	"region" text DEFAULT '' NOT NULL,
	"unit_system" "unit_system" DEFAULT 'us' NOT NULL,
	"labour_hours_available_by_month" jsonb NOT NULL,
	"interest_rate_percent" numeric(5, 2) NOT NULL,
	"fixed_costs_usd_per_year" numeric(12, 2) DEFAULT 0 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "field_operations" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"farm_id" uuid NOT NULL,
	"key" text NOT NULL,
	"name" text NOT NULL,
	"by" "operation_by" NOT NULL,
	"month" smallint NOT NULL,
	"speed_mph" numeric(5, 2),
	"width_ft" numeric(6, 2),
	"field_efficiency_percent" numeric(5, 2),
	"fuel_basis" "fuel_basis",
	"diesel_gallons_per_acre" numeric(6, 3),
	"tractor_max_pto_hp" numeric(6, 1),
	"diesel_gallons_per_hp_hour" numeric(6, 4),
	"labour_factor" numeric(4, 2),
	"repairs_usd_per_acre" numeric(8, 2),
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "fields" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"farm_id" uuid NOT NULL,
	"key" text NOT NULL,
	"name" text NOT NULL,
	"acres" numeric(10, 2) NOT NULL,
	"productivity_index" numeric(4, 2) DEFAULT 1 NOT NULL,
	"prior_crop" text DEFAULT '' NOT NULL,
	"prior_crop_nitrogen_credit_lb_per_acre" numeric(7, 2) DEFAULT 0 NOT NULL,
	"notes" text DEFAULT '' NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "herds" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"farm_id" uuid NOT NULL,
	"head" integer NOT NULL,
	"average_weight_lb" numeric(8, 1) NOT NULL,
	"intake_lb_dm_per_au_day" numeric(6, 2) NOT NULL,
	"feeding_season_start_month" smallint NOT NULL,
	"feeding_season_days" smallint NOT NULL,
	"max_grazing_days" smallint,
	"bale_weight_lb" numeric(8, 1) NOT NULL,
	"bale_dry_matter_percent" numeric(5, 2) NOT NULL,
	"feeding_waste_percent" numeric(5, 2) NOT NULL,
	"chore_hours_per_day_feeding_hay" numeric(5, 2) NOT NULL,
	"chore_hours_per_day_grazing" numeric(5, 2) NOT NULL,
	"manure_nitrogen_lb_per_au_day" numeric(6, 3) NOT NULL,
	"manure_nitrogen_available_percent" numeric(5, 2) NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "herds_farmId_unique" UNIQUE("farm_id")
);
--> statement-breakpoint
CREATE TABLE "invitations" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"farm_id" uuid NOT NULL,
	"email" text NOT NULL,
	"role" "farm_role" NOT NULL,
	"token_hash" text NOT NULL,
	"invited_by_id" uuid,
	"expires_at" timestamp with time zone NOT NULL,
	"accepted_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "invitations_tokenHash_unique" UNIQUE("token_hash")
);
--> statement-breakpoint
CREATE TABLE "memberships" (
	"farm_id" uuid NOT NULL,
	"user_id" uuid NOT NULL,
	"role" "farm_role" NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "memberships_farm_id_user_id_pk" PRIMARY KEY("farm_id","user_id")
);
--> statement-breakpoint
CREATE TABLE "plan_field_assignments" (
	"plan_version_id" uuid NOT NULL,
	"field_id" uuid NOT NULL,
	"rotation_id" uuid NOT NULL,
	"starting_phase" smallint NOT NULL,
	CONSTRAINT "plan_field_assignments_plan_version_id_field_id_pk" PRIMARY KEY("plan_version_id","field_id")
);
--> statement-breakpoint
CREATE TABLE "plan_versions" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"plan_id" uuid NOT NULL,
	"version" integer NOT NULL,
	"start_year" smallint NOT NULL,
	"years" smallint NOT NULL,
	"assumptions" jsonb DEFAULT '[]'::jsonb NOT NULL,
	"herd" jsonb,
	"notes" text DEFAULT '' NOT NULL,
	"saved_by_id" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "plans" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"farm_id" uuid NOT NULL,
	"name" text NOT NULL,
	"is_reference" boolean DEFAULT false NOT NULL,
	"current_version" integer DEFAULT 1 NOT NULL,
	"created_by_id" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "practice_operations" (
	"practice_id" uuid NOT NULL,
	"sequence" smallint NOT NULL,
	"operation_id" uuid NOT NULL,
	"month" smallint,
	"passes" smallint DEFAULT 1 NOT NULL,
	CONSTRAINT "practice_operations_practice_id_sequence_pk" PRIMARY KEY("practice_id","sequence")
);
--> statement-breakpoint
CREATE TABLE "price_set_items" (
	"price_set_id" uuid NOT NULL,
	"kind" "price_item_kind" NOT NULL,
	"key" text NOT NULL,
	"price_usd" numeric(12, 4) NOT NULL,
	CONSTRAINT "price_set_items_price_set_id_kind_key_pk" PRIMARY KEY("price_set_id","kind","key")
);
--> statement-breakpoint
CREATE TABLE "price_sets" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"farm_id" uuid NOT NULL,
	"year" smallint NOT NULL,
	"nitrogen_usd_per_lb" numeric(10, 4) NOT NULL,
	"diesel_usd_per_gallon" numeric(10, 4) NOT NULL,
	"labour_usd_per_hour" numeric(10, 2) NOT NULL,
	"hay_usd_per_bale" numeric(10, 2) NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "reviews" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"plan_version_id" uuid NOT NULL,
	"reviewer_id" uuid,
	"decision" "review_decision" NOT NULL,
	"note" text DEFAULT '' NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "rotation_steps" (
	"rotation_id" uuid NOT NULL,
	"position" smallint NOT NULL,
	"practice_id" uuid NOT NULL,
	CONSTRAINT "rotation_steps_rotation_id_position_pk" PRIMARY KEY("rotation_id","position")
);
--> statement-breakpoint
CREATE TABLE "rotations" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"farm_id" uuid NOT NULL,
	"key" text NOT NULL,
	"name" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "sessions" (
	"session_token" text PRIMARY KEY NOT NULL,
	"user_id" uuid NOT NULL,
	"expires" timestamp with time zone NOT NULL
);
--> statement-breakpoint
CREATE TABLE "sign_in_limits" (
	"key" varchar(255) PRIMARY KEY NOT NULL,
	"points" integer DEFAULT 0 NOT NULL,
	"expire" bigint
);
--> statement-breakpoint
CREATE TABLE "users" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"name" text,
	"email" text NOT NULL,
	"email_verified" timestamp with time zone,
	"image" text,
	"password_hash" text,
	"is_site_admin" boolean DEFAULT false NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "users_email_unique" UNIQUE("email")
);
--> statement-breakpoint
CREATE TABLE "verification_tokens" (
	"identifier" text NOT NULL,
	"token" text NOT NULL,
	"expires" timestamp with time zone NOT NULL,
	CONSTRAINT "verification_tokens_identifier_token_pk" PRIMARY KEY("identifier","token")
);
--> statement-breakpoint
ALTER TABLE "accounts" ADD CONSTRAINT "accounts_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "audit_log" ADD CONSTRAINT "audit_log_farm_id_farms_id_fk" FOREIGN KEY ("farm_id") REFERENCES "public"."farms"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "audit_log" ADD CONSTRAINT "audit_log_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "comments" ADD CONSTRAINT "comments_plan_version_id_plan_versions_id_fk" FOREIGN KEY ("plan_version_id") REFERENCES "public"."plan_versions"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "comments" ADD CONSTRAINT "comments_author_id_users_id_fk" FOREIGN KEY ("author_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "crop_practices" ADD CONSTRAINT "crop_practices_farm_id_farms_id_fk" FOREIGN KEY ("farm_id") REFERENCES "public"."farms"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "field_operations" ADD CONSTRAINT "field_operations_farm_id_farms_id_fk" FOREIGN KEY ("farm_id") REFERENCES "public"."farms"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "fields" ADD CONSTRAINT "fields_farm_id_farms_id_fk" FOREIGN KEY ("farm_id") REFERENCES "public"."farms"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "herds" ADD CONSTRAINT "herds_farm_id_farms_id_fk" FOREIGN KEY ("farm_id") REFERENCES "public"."farms"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "invitations" ADD CONSTRAINT "invitations_farm_id_farms_id_fk" FOREIGN KEY ("farm_id") REFERENCES "public"."farms"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "invitations" ADD CONSTRAINT "invitations_invited_by_id_users_id_fk" FOREIGN KEY ("invited_by_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "memberships" ADD CONSTRAINT "memberships_farm_id_farms_id_fk" FOREIGN KEY ("farm_id") REFERENCES "public"."farms"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "memberships" ADD CONSTRAINT "memberships_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "plan_field_assignments" ADD CONSTRAINT "plan_field_assignments_plan_version_id_plan_versions_id_fk" FOREIGN KEY ("plan_version_id") REFERENCES "public"."plan_versions"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "plan_field_assignments" ADD CONSTRAINT "plan_field_assignments_field_id_fields_id_fk" FOREIGN KEY ("field_id") REFERENCES "public"."fields"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "plan_field_assignments" ADD CONSTRAINT "plan_field_assignments_rotation_id_rotations_id_fk" FOREIGN KEY ("rotation_id") REFERENCES "public"."rotations"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "plan_versions" ADD CONSTRAINT "plan_versions_plan_id_plans_id_fk" FOREIGN KEY ("plan_id") REFERENCES "public"."plans"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "plan_versions" ADD CONSTRAINT "plan_versions_saved_by_id_users_id_fk" FOREIGN KEY ("saved_by_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "plans" ADD CONSTRAINT "plans_farm_id_farms_id_fk" FOREIGN KEY ("farm_id") REFERENCES "public"."farms"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "plans" ADD CONSTRAINT "plans_created_by_id_users_id_fk" FOREIGN KEY ("created_by_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "practice_operations" ADD CONSTRAINT "practice_operations_practice_id_crop_practices_id_fk" FOREIGN KEY ("practice_id") REFERENCES "public"."crop_practices"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "practice_operations" ADD CONSTRAINT "practice_operations_operation_id_field_operations_id_fk" FOREIGN KEY ("operation_id") REFERENCES "public"."field_operations"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "price_set_items" ADD CONSTRAINT "price_set_items_price_set_id_price_sets_id_fk" FOREIGN KEY ("price_set_id") REFERENCES "public"."price_sets"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "price_sets" ADD CONSTRAINT "price_sets_farm_id_farms_id_fk" FOREIGN KEY ("farm_id") REFERENCES "public"."farms"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "reviews" ADD CONSTRAINT "reviews_plan_version_id_plan_versions_id_fk" FOREIGN KEY ("plan_version_id") REFERENCES "public"."plan_versions"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "reviews" ADD CONSTRAINT "reviews_reviewer_id_users_id_fk" FOREIGN KEY ("reviewer_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "rotation_steps" ADD CONSTRAINT "rotation_steps_rotation_id_rotations_id_fk" FOREIGN KEY ("rotation_id") REFERENCES "public"."rotations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "rotation_steps" ADD CONSTRAINT "rotation_steps_practice_id_crop_practices_id_fk" FOREIGN KEY ("practice_id") REFERENCES "public"."crop_practices"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "rotations" ADD CONSTRAINT "rotations_farm_id_farms_id_fk" FOREIGN KEY ("farm_id") REFERENCES "public"."farms"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "sessions" ADD CONSTRAINT "sessions_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "audit_log_farm_id_created_at_index" ON "audit_log" USING btree ("farm_id","created_at");--> statement-breakpoint
CREATE INDEX "comments_plan_version_id_index" ON "comments" USING btree ("plan_version_id");--> statement-breakpoint
CREATE UNIQUE INDEX "crop_practices_farm_id_key_index" ON "crop_practices" USING btree ("farm_id","key");--> statement-breakpoint
CREATE UNIQUE INDEX "field_operations_farm_id_key_index" ON "field_operations" USING btree ("farm_id","key");--> statement-breakpoint
CREATE UNIQUE INDEX "fields_farm_id_key_index" ON "fields" USING btree ("farm_id","key");--> statement-breakpoint
CREATE INDEX "invitations_farm_id_index" ON "invitations" USING btree ("farm_id");--> statement-breakpoint
CREATE INDEX "invitations_email_index" ON "invitations" USING btree ("email");--> statement-breakpoint
CREATE INDEX "memberships_user_id_index" ON "memberships" USING btree ("user_id");--> statement-breakpoint
CREATE UNIQUE INDEX "plan_versions_plan_id_version_index" ON "plan_versions" USING btree ("plan_id","version");--> statement-breakpoint
CREATE INDEX "plans_farm_id_index" ON "plans" USING btree ("farm_id");--> statement-breakpoint
CREATE UNIQUE INDEX "plans_one_reference_per_farm" ON "plans" USING btree ("farm_id") WHERE "plans"."is_reference";--> statement-breakpoint
CREATE INDEX "practice_operations_operation_id_index" ON "practice_operations" USING btree ("operation_id");--> statement-breakpoint
CREATE UNIQUE INDEX "price_sets_farm_id_year_index" ON "price_sets" USING btree ("farm_id","year");--> statement-breakpoint
CREATE INDEX "reviews_plan_version_id_index" ON "reviews" USING btree ("plan_version_id");--> statement-breakpoint
CREATE INDEX "rotation_steps_practice_id_index" ON "rotation_steps" USING btree ("practice_id");--> statement-breakpoint
CREATE UNIQUE INDEX "rotations_farm_id_key_index" ON "rotations" USING btree ("farm_id","key");