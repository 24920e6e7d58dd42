import { relations } from 'drizzle-orm';
import { jsonb, numeric, pgEnum, pgTable, text, uniqueIndex, uuid } from 'drizzle-orm/pg-core';
import { personRoles } from '../../../farm-lists';
import { timestamps } from './columns';
import { farmReference, farms } from './farms';

export const personRole = pgEnum('person_role', personRoles);

/**
 * Someone who works on the farm. The farm's labour hours (`farms.labour_hours_available_by_month`) are
 * the operator's, partners' and family's hours summed; hired help is bought at its wage.
 */
export const people = pgTable(
	'people',
	{
		id: uuid().primaryKey().defaultRandom(),
		farmId: farmReference(),
		key: text().notNull(),
		name: text().notNull(),
		role: personRole().notNull(),
		/** Hours free for farm work, January to December (an off-farm job takes its hours away). */
		hoursAvailableByMonth: jsonb().$type<number[]>().notNull(),
		/** Hired help only. */
		wageUsdPerHour: numeric({ mode: 'number', precision: 8, scale: 2 }),
		notes: text().notNull().default(''),
		...timestamps
	},
	(t) => [uniqueIndex().on(t.farmId, t.key)]
);

export const peopleRelations = relations(people, ({ one }) => ({
	farm: one(farms, { fields: [people.farmId], references: [farms.id] })
}));
