import { relations } from 'drizzle-orm';
import {
	index,
	jsonb,
	numeric,
	pgTable,
	primaryKey,
	smallint,
	text,
	uniqueIndex,
	uuid
} from 'drizzle-orm/pg-core';
import type { CropPractice } from '../../../schemas/plan-file';
import { timestamps } from './columns';
import { farmReference, farms } from './farms';
import { fieldOperations } from './operations';

/** A practice as the plan file states it, less what has columns (or rows, for its operations). */
export type CropPracticeDetail = Omit<
	CropPractice,
	| 'id'
	| 'name'
	| 'crop'
	| 'yieldGoalPerAcre'
	| 'otherFertiliserUsdPerAcre'
	| 'chemicalsUsdPerAcre'
	| 'otherDirectUsdPerAcre'
	| 'operations'
>;

/** One year of one crop: what it costs, what it yields, what it leaves and what it offers for grazing. */
export const cropPractices = pgTable(
	'crop_practices',
	{
		id: uuid().primaryKey().defaultRandom(),
		farmId: farmReference(),
		key: text().notNull(),
		name: text().notNull(),
		/** The crop's id (`crops.key`): a built-in or one of the farm's own. */
		crop: text().notNull(),
		/** Per acre in the crop's sale unit. */
		yieldGoalPerAcre: numeric({ mode: 'number', precision: 10, scale: 2 }).notNull(),
		otherFertiliserUsdPerAcre: numeric({ mode: 'number', precision: 8, scale: 2 }).notNull(),
		chemicalsUsdPerAcre: numeric({ mode: 'number', precision: 8, scale: 2 }).notNull(),
		/** Drying, hauling, crop insurance and the like. */
		otherDirectUsdPerAcre: numeric({ mode: 'number', precision: 8, scale: 2 }).notNull(),
		/** The rest as the plan file states it: seed, N rate and response, cover mix, credits, grazing. */
		detail: jsonb().$type<CropPracticeDetail>().notNull(),
		...timestamps
	},
	(t) => [uniqueIndex().on(t.farmId, t.key)]
);

export const cropPracticesRelations = relations(cropPractices, ({ one, many }) => ({
	farm: one(farms, { fields: [cropPractices.farmId], references: [farms.id] }),
	operations: many(practiceOperations)
}));

export const practiceOperations = pgTable(
	'practice_operations',
	{
		practiceId: uuid()
			.notNull()
			.references(() => cropPractices.id, { onDelete: 'cascade' }),
		sequence: smallint().notNull(),
		operationId: uuid()
			.notNull()
			.references(() => fieldOperations.id, { onDelete: 'restrict' }),
		/** Overrides the operation's usual month for this practice. */
		month: smallint(),
		passes: smallint().notNull().default(1)
	},
	(t) => [primaryKey({ columns: [t.practiceId, t.sequence] }), index().on(t.operationId)]
);

export const practiceOperationsRelations = relations(practiceOperations, ({ one }) => ({
	practice: one(cropPractices, {
		fields: [practiceOperations.practiceId],
		references: [cropPractices.id]
	}),
	operation: one(fieldOperations, {
		fields: [practiceOperations.operationId],
		references: [fieldOperations.id]
	})
}));
