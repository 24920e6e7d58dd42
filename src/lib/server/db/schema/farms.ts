// Farms and who may see them.
import { relations } from 'drizzle-orm';
import {
	index,
	jsonb,
	numeric,
	pgEnum,
	pgTable,
	primaryKey,
	text,
	timestamp,
	uuid
} from 'drizzle-orm/pg-core';
import { farmRoles } from '../../../roles';
import { users } from './auth';
import { unitSystems } from '../../../unit-systems';
import { timestamps } from './columns';
import { crops } from './crops';
import { fieldOperations } from './operations';
import { fields } from './fields';
import { herds } from './herds';
import { people } from './people';
import { plans } from './plans';
import { cropPractices } from './practices';
import { priceSets } from './prices';
import { rotations } from './rotations';

export const farmRole = pgEnum('farm_role', farmRoles);
export const unitSystem = pgEnum('unit_system', unitSystems);

export const farms = pgTable('farms', {
	id: uuid().primaryKey().defaultRandom(),
	name: text().notNull(),
	region: text().notNull().default(''),
	unitSystem: unitSystem().notNull().default('us'),
	/** Family labour available, hours per month, January to December. */
	labourHoursAvailableByMonth: jsonb().$type<number[]>().notNull(),
	/** Annual rate charged on operating money for the months it is carried. */
	interestRatePercent: numeric({ mode: 'number', precision: 5, scale: 2 }).notNull(),
	/** Ownership and overhead costs no plan changes: land, machinery, buildings, insurance. */
	fixedCostsUsdPerYear: numeric({ mode: 'number', precision: 12, scale: 2 }).notNull().default(0),
	...timestamps
});

/**
 * The farm a row belongs to; it goes when the farm goes. A function declaration, so the other schema
 * modules can call it while this one is still loading (they import each other for relations).
 */
export function farmReference() {
	return uuid()
		.notNull()
		.references(() => farms.id, { onDelete: 'cascade' });
}

export const farmsRelations = relations(farms, ({ many }) => ({
	memberships: many(memberships),
	crops: many(crops),
	fields: many(fields),
	herds: many(herds),
	people: many(people),
	priceSets: many(priceSets),
	fieldOperations: many(fieldOperations),
	cropPractices: many(cropPractices),
	rotations: many(rotations),
	plans: many(plans)
}));

export const memberships = pgTable(
	'memberships',
	{
		farmId: farmReference(),
		userId: uuid()
			.notNull()
			.references(() => users.id, { onDelete: 'cascade' }),
		role: farmRole().notNull(),
		...timestamps
	},
	(t) => [primaryKey({ columns: [t.farmId, t.userId] }), index().on(t.userId)]
);

export const membershipsRelations = relations(memberships, ({ one }) => ({
	farm: one(farms, { fields: [memberships.farmId], references: [farms.id] }),
	user: one(users, { fields: [memberships.userId], references: [users.id] })
}));

export const invitations = pgTable(
	'invitations',
	{
		id: uuid().primaryKey().defaultRandom(),
		farmId: farmReference(),
		email: text().notNull(),
		role: farmRole().notNull(),
		/** SHA-256 of the token sent by mail; the token itself is never stored. */
		tokenHash: text().notNull().unique(),
		invitedById: uuid().references(() => users.id, { onDelete: 'set null' }),
		expiresAt: timestamp({ withTimezone: true }).notNull(),
		acceptedAt: timestamp({ withTimezone: true }),
		/** Who followed the link: the account the membership was given to. */
		acceptedById: uuid().references(() => users.id, { onDelete: 'set null' }),
		/** Set when an owner withdraws the invitation; its link then refuses. */
		revokedAt: timestamp({ withTimezone: true }),
		revokedById: uuid().references(() => users.id, { onDelete: 'set null' }),
		...timestamps
	},
	(t) => [index().on(t.farmId), index().on(t.email)]
);

export const invitationsRelations = relations(invitations, ({ one }) => ({
	farm: one(farms, { fields: [invitations.farmId], references: [farms.id] }),
	invitedBy: one(users, { fields: [invitations.invitedById], references: [users.id] })
}));
