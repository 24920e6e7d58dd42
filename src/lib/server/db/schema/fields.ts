// What the farm has. Each part keeps the plan file's id as `key`, so files round-trip.
import { relations } from 'drizzle-orm';
import { numeric, pgEnum, pgTable, text, uniqueIndex, uuid } from 'drizzle-orm/pg-core';
import { tenures } from '../../../farm-lists';
import { timestamps } from './columns';
import { farmReference, farms } from './farms';

export const fieldTenure = pgEnum('field_tenure', tenures);

export const fields = pgTable(
	'fields',
	{
		id: uuid().primaryKey().defaultRandom(),
		farmId: farmReference(),
		key: text().notNull(),
		name: text().notNull(),
		acres: numeric({ mode: 'number', precision: 10, scale: 2 }).notNull(),
		/** 1.00 = farm average. */
		productivityIndex: numeric({ mode: 'number', precision: 4, scale: 2 }).notNull().default(1.0),
		priorCrop: text().notNull().default(''),
		priorCropNitrogenCreditLbPerAcre: numeric({ mode: 'number', precision: 7, scale: 2 })
			.notNull()
			.default(0),
		tenure: fieldTenure().notNull().default('owned'),
		/** Cash rent a year, the field's land cost in the budgets; 0 for owned land. */
		cashRentUsdPerAcre: numeric({ mode: 'number', precision: 8, scale: 2 }).notNull().default(0),
		notes: text().notNull().default(''),
		...timestamps
	},
	(t) => [uniqueIndex().on(t.farmId, t.key)]
);

export const fieldsRelations = relations(fields, ({ one }) => ({
	farm: one(farms, { fields: [fields.farmId], references: [farms.id] })
}));
