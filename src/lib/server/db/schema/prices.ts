import { relations } from 'drizzle-orm';
import {
	numeric,
	pgEnum,
	pgTable,
	primaryKey,
	smallint,
	text,
	uniqueIndex,
	uuid
} from 'drizzle-orm/pg-core';
import { timestamps } from './columns';
import { farmReference, farms } from './farms';

/** One year's prices; crop, seed and custom-hire prices are its items. */
export const priceSets = pgTable(
	'price_sets',
	{
		id: uuid().primaryKey().defaultRandom(),
		farmId: farmReference(),
		year: smallint().notNull(),
		nitrogenUsdPerLb: numeric({ mode: 'number', precision: 10, scale: 4 }).notNull(),
		dieselUsdPerGallon: numeric({ mode: 'number', precision: 10, scale: 4 }).notNull(),
		labourUsdPerHour: numeric({ mode: 'number', precision: 10, scale: 2 }).notNull(),
		hayUsdPerBale: numeric({ mode: 'number', precision: 10, scale: 2 }).notNull(),
		...timestamps
	},
	(t) => [uniqueIndex().on(t.farmId, t.year)]
);

export const priceSetsRelations = relations(priceSets, ({ one, many }) => ({
	farm: one(farms, { fields: [priceSets.farmId], references: [farms.id] }),
	items: many(priceSetItems)
}));

export const priceItemKind = pgEnum('price_item_kind', [
	'crop',
	'seed-per-thousand-seeds',
	'seed-per-lb',
	'custom-rate-per-acre'
]);

export const priceSetItems = pgTable(
	'price_set_items',
	{
		priceSetId: uuid()
			.notNull()
			.references(() => priceSets.id, { onDelete: 'cascade' }),
		kind: priceItemKind().notNull(),
		/** The crop, seed or operation the price is for. */
		key: text().notNull(),
		priceUsd: numeric({ mode: 'number', precision: 12, scale: 4 }).notNull()
	},
	(t) => [primaryKey({ columns: [t.priceSetId, t.kind, t.key] })]
);

export const priceSetItemsRelations = relations(priceSetItems, ({ one }) => ({
	priceSet: one(priceSets, { fields: [priceSetItems.priceSetId], references: [priceSets.id] })
}));
