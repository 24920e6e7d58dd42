CREATE TABLE "farm_cash_flow_settings" (
	"farm_id" uuid PRIMARY KEY NOT NULL,
	"starting_cash_usd" numeric(12, 2) NOT NULL,
	"minimum_balance_usd" numeric(12, 2) NOT NULL,
	"sale_months" jsonb DEFAULT '[]'::jsonb NOT NULL,
	"updated_by_id" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "farm_cash_flow_settings" ADD CONSTRAINT "farm_cash_flow_settings_farm_id_farms_id_fk" FOREIGN KEY ("farm_id") REFERENCES "public"."farms"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "farm_cash_flow_settings" ADD CONSTRAINT "farm_cash_flow_settings_updated_by_id_users_id_fk" FOREIGN KEY ("updated_by_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;