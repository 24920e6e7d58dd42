import { relations } from 'drizzle-orm';
import { boolean, numeric, pgEnum, pgTable, text, uniqueIndex, uuid } from 'drizzle-orm/pg-core';
import { saleUnits } from '../../../schemas/crops';
import { timestamps } from './columns';
import { farmReference, farms } from './farms';

export const saleUnit = pgEnum('sale_unit', saleUnits);

/** A crop the farm grows: how it is sold, what a unit weighs, its grazable residue, legume or not. */
export const crops = pgTable(
	'crops',
	{
		id: uuid().primaryKey().defaultRandom(),
		farmId: farmReference(),
		key: text().notNull(),
		name: text().notNull(),
		soldBy: saleUnit().notNull(),
		lbPerUnit: numeric({ mode: 'number', precision: 8, scale: 3 }).notNull(),
		/** Leaf and husk DM cattle can graze per unit of grain; null: none. */
		residueLeafHuskLbDmPerUnit: numeric({ mode: 'number', precision: 6, scale: 2 }),
		legume: boolean().notNull().default(false),
		...timestamps
	},
	(t) => [uniqueIndex().on(t.farmId, t.key)]
);

export const cropsRelations = relations(crops, ({ one }) => ({
	farm: one(farms, { fields: [crops.farmId], references: [farms.id] })
}));
