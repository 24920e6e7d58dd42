import { relations } from 'drizzle-orm';
import { index, pgTable, primaryKey, smallint, text, uniqueIndex, uuid } from 'drizzle-orm/pg-core';
import { timestamps } from './columns';
import { farmReference, farms } from './farms';
import { cropPractices } from './practices';

export const rotations = pgTable(
	'rotations',
	{
		id: uuid().primaryKey().defaultRandom(),
		farmId: farmReference(),
		key: text().notNull(),
		name: text().notNull(),
		...timestamps
	},
	(t) => [uniqueIndex().on(t.farmId, t.key)]
);

export const rotationsRelations = relations(rotations, ({ one, many }) => ({
	farm: one(farms, { fields: [rotations.farmId], references: [farms.id] }),
	steps: many(rotationSteps)
}));

export const rotationSteps = pgTable(
	'rotation_steps',
	{
		rotationId: uuid()
			.notNull()
			.references(() => rotations.id, { onDelete: 'cascade' }),
		/** 1 = the rotation's first year. */
		position: smallint().notNull(),
		practiceId: uuid()
			.notNull()
			.references(() => cropPractices.id, { onDelete: 'restrict' })
	},
	(t) => [primaryKey({ columns: [t.rotationId, t.position] }), index().on(t.practiceId)]
);

export const rotationStepsRelations = relations(rotationSteps, ({ one }) => ({
	rotation: one(rotations, { fields: [rotationSteps.rotationId], references: [rotations.id] }),
	practice: one(cropPractices, {
		fields: [rotationSteps.practiceId],
		references: [cropPractices.id]
	})
}));
