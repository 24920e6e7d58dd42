CREATE TYPE "public"."sale_unit" AS ENUM('bu', 'cwt', 'ton', 'lb');--> statement-breakpoint
CREATE TYPE "public"."operation_stated_as" AS ENUM('machine', 'per-acre');--> statement-breakpoint
CREATE TABLE "crops" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"farm_id" uuid NOT NULL,
	"key" text NOT NULL,
	"name" text NOT NULL,
	"sold_by" "sale_unit" NOT NULL,
	"lb_per_unit" numeric(8, 3) NOT NULL,
	"residue_leaf_husk_lb_dm_per_unit" numeric(6, 2),
	"legume" boolean DEFAULT false NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "field_operations" ADD COLUMN "stated_as" "operation_stated_as";--> statement-breakpoint
ALTER TABLE "field_operations" ADD COLUMN "machine_hours_per_acre" numeric(6, 4);--> statement-breakpoint
ALTER TABLE "field_operations" ADD COLUMN "labour_hours_per_acre" numeric(6, 4);--> statement-breakpoint
ALTER TABLE "crops" ADD CONSTRAINT "crops_farm_id_farms_id_fk" FOREIGN KEY ("farm_id") REFERENCES "public"."farms"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "crops_farm_id_key_index" ON "crops" USING btree ("farm_id","key");--> statement-breakpoint
-- Plan format 2. Own operations state how they are given; every one of format 1 was given by machine.
UPDATE "field_operations" SET "stated_as" = 'machine' WHERE "by" = 'own';--> statement-breakpoint
-- Residue grazing's leaf and husk is per sale unit in format 2; format 1 said per bushel, 16 when left
-- out (UNL, Rasby 2007), so the figure is carried over under its new name.
UPDATE "crop_practices"
SET "detail" = jsonb_set(
	"detail",
	'{residueGrazing}',
	(("detail" -> 'residueGrazing') - 'leafHuskLbDmPerBu')
		|| jsonb_build_object(
			'leafHuskLbDmPerUnit',
			COALESCE("detail" -> 'residueGrazing' -> 'leafHuskLbDmPerBu', '16'::jsonb)
		)
)
WHERE jsonb_typeof("detail" -> 'residueGrazing') = 'object';--> statement-breakpoint
-- Every farm gets the built-in crops its format-1 practices could name. Bushel weights: Univ. of
-- Missouri G4020 and FCIC-25010; corn leaf and husk: UNL (Rasby 2007), 16 lb DM per bushel.
INSERT INTO "crops" ("farm_id", "key", "name", "sold_by", "lb_per_unit", "residue_leaf_husk_lb_dm_per_unit", "legume")
SELECT f."id", c."key", c."name", c."sold_by"::"sale_unit", c."lb_per_unit", c."residue", c."legume"
FROM "farms" f
CROSS JOIN (VALUES
	('corn', 'Corn', 'bu', 56, 16, false),
	('soybean', 'Soybean', 'bu', 60, NULL, true),
	('wheat', 'Wheat', 'bu', 60, NULL, false),
	('oats', 'Oats', 'bu', 32, NULL, false),
	('barley', 'Barley', 'bu', 48, NULL, false),
	('rye', 'Rye', 'bu', 56, NULL, false),
	('oat-pea-forage', 'Oat–pea forage', 'ton', 2000, NULL, false),
	('hay', 'Hay', 'ton', 2000, NULL, false)
) AS c("key", "name", "sold_by", "lb_per_unit", "residue", "legume")
ON CONFLICT DO NOTHING;
