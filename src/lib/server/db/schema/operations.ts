import { relations } from 'drizzle-orm';
import { numeric, pgEnum, pgTable, smallint, text, uniqueIndex, uuid } from 'drizzle-orm/pg-core';
import { timestamps } from './columns';
import { farmReference, farms } from './farms';

export const operationBy = pgEnum('operation_by', ['own', 'custom']);
export const fuelBasis = pgEnum('fuel_basis', ['per-acre', 'pto-power']);
/** How an own operation is stated: by its machine (capacity → hours) or by published per-acre rates. */
export const operationStatedAs = pgEnum('operation_stated_as', ['machine', 'per-acre']);

/** A field operation: own machinery (capacity, fuel, labour, repairs) or hired at a custom rate. */
export const fieldOperations = pgTable(
	'field_operations',
	{
		id: uuid().primaryKey().defaultRandom(),
		farmId: farmReference(),
		key: text().notNull(),
		name: text().notNull(),
		by: operationBy().notNull(),
		/** 1 = January. */
		month: smallint().notNull(),
		/** Own operations only. */
		statedAs: operationStatedAs(),
		speedMph: numeric({ mode: 'number', precision: 5, scale: 2 }),
		widthFt: numeric({ mode: 'number', precision: 6, scale: 2 }),
		fieldEfficiencyPercent: numeric({ mode: 'number', precision: 5, scale: 2 }),
		fuelBasis: fuelBasis(),
		dieselGallonsPerAcre: numeric({ mode: 'number', precision: 6, scale: 3 }),
		tractorMaxPtoHp: numeric({ mode: 'number', precision: 6, scale: 1 }),
		dieselGallonsPerHpHour: numeric({ mode: 'number', precision: 6, scale: 4 }),
		labourFactor: numeric({ mode: 'number', precision: 4, scale: 2 }),
		repairsUsdPerAcre: numeric({ mode: 'number', precision: 8, scale: 2 }),
		/** Stated per acre: hours as published, nothing derived. */
		machineHoursPerAcre: numeric({ mode: 'number', precision: 6, scale: 4 }),
		labourHoursPerAcre: numeric({ mode: 'number', precision: 6, scale: 4 }),
		/** The catalogue default this operation was copied from (it names its source); null: the farm's own. */
		copiedFrom: text(),
		...timestamps
	},
	(t) => [uniqueIndex().on(t.farmId, t.key)]
);

export const fieldOperationsRelations = relations(fieldOperations, ({ one }) => ({
	farm: one(farms, { fields: [fieldOperations.farmId], references: [farms.id] })
}));
