import { relations } from 'drizzle-orm';
import { integer, numeric, pgTable, smallint, uuid } from 'drizzle-orm/pg-core';
import { timestamps } from './columns';
import { farmReference, farms } from './farms';

/** The farm's cow herd (one per farm). */
export const herds = pgTable('herds', {
	id: uuid().primaryKey().defaultRandom(),
	farmId: farmReference().unique(),
	head: integer().notNull(),
	averageWeightLb: numeric({ mode: 'number', precision: 8, scale: 1 }).notNull(),
	intakeLbDmPerAuDay: numeric({ mode: 'number', precision: 6, scale: 2 }).notNull(),
	feedingSeasonStartMonth: smallint().notNull(),
	feedingSeasonDays: smallint().notNull(),
	/** Days grazing can last before snow or mud stops it; null: the whole feeding season. */
	maxGrazingDays: smallint(),
	baleWeightLb: numeric({ mode: 'number', precision: 8, scale: 1 }).notNull(),
	baleDryMatterPercent: numeric({ mode: 'number', precision: 5, scale: 2 }).notNull(),
	feedingWastePercent: numeric({ mode: 'number', precision: 5, scale: 2 }).notNull(),
	choreHoursPerDayFeedingHay: numeric({ mode: 'number', precision: 5, scale: 2 }).notNull(),
	choreHoursPerDayGrazing: numeric({ mode: 'number', precision: 5, scale: 2 }).notNull(),
	manureNitrogenLbPerAuDay: numeric({ mode: 'number', precision: 6, scale: 3 }).notNull(),
	manureNitrogenAvailablePercent: numeric({ mode: 'number', precision: 5, scale: 2 }).notNull(),
	...timestamps
});

export const herdsRelations = relations(herds, ({ one }) => ({
	farm: one(farms, { fields: [herds.farmId], references: [farms.id] })
}));
