// Plans, their versions and reviews.
import { relations, sql } from 'drizzle-orm';
import {
	boolean,
	index,
	integer,
	jsonb,
	pgEnum,
	pgTable,
	primaryKey,
	smallint,
	text,
	timestamp,
	uniqueIndex,
	uuid
} from 'drizzle-orm/pg-core';
import type { Herd, PlanAdjustment } from '../../../schemas/plan-file';
import { reviewDecisions } from '../../../schemas/reviews';

export type StoredAdjustment = Omit<PlanAdjustment, 'fieldId' | 'practiceId'> & {
	fieldRowId?: string;
	practiceRowId?: string;
};
import { users } from './auth';
import { timestamps } from './columns';
import { farmReference, farms } from './farms';
import { fields } from './fields';
import { rotations } from './rotations';

export const reviewDecision = pgEnum('review_decision', reviewDecisions);

export const plans = pgTable(
	'plans',
	{
		id: uuid().primaryKey().defaultRandom(),
		farmId: farmReference(),
		name: text().notNull(),
		isReference: boolean().notNull().default(false),
		/** The newest version number; a save naming an older one is refused. */
		currentVersion: integer().notNull().default(1),
		createdById: uuid().references(() => users.id, { onDelete: 'set null' }),
		...timestamps
	},
	(t) => [
		index().on(t.farmId),
		uniqueIndex('plans_one_reference_per_farm')
			.on(t.farmId)
			.where(sql`${t.isReference}`)
	]
);

export const plansRelations = relations(plans, ({ one, many }) => ({
	farm: one(farms, { fields: [plans.farmId], references: [farms.id] }),
	versions: many(planVersions)
}));

export const planVersions = pgTable(
	'plan_versions',
	{
		id: uuid().primaryKey().defaultRandom(),
		planId: uuid()
			.notNull()
			.references(() => plans.id, { onDelete: 'cascade' }),
		version: integer().notNull(),
		startYear: smallint().notNull(),
		years: smallint().notNull(),
		/** Plain statements shown with the results. */
		assumptions: jsonb().$type<string[]>().notNull().default([]),
		/**
		 * The N and yield changes the plan tests, as the plan file's `plan.adjustments` but naming fields
		 * and practices by row id, so a renamed key keeps them on the same field and practice.
		 */
		adjustments: jsonb().$type<StoredAdjustment[]>().notNull().default([]),
		/**
		 * The herd as this plan runs it (grazing season, manure credit…), starting from the farm's herd;
		 * null: the plan keeps no cattle. Stated as the plan file's `herd`.
		 */
		herd: jsonb().$type<Herd>(),
		notes: text().notNull().default(''),
		/** What the person who saved this version said about it ("Lower N on the east fields"). */
		changeNote: text().notNull().default(''),
		/** The version this one restored, when it was made by restoring an older one. */
		restoredFromVersion: integer(),
		savedById: uuid().references(() => users.id, { onDelete: 'set null' }),
		createdAt: timestamp({ withTimezone: true }).notNull().defaultNow()
	},
	(t) => [uniqueIndex().on(t.planId, t.version)]
);

export const planVersionsRelations = relations(planVersions, ({ one, many }) => ({
	plan: one(plans, { fields: [planVersions.planId], references: [plans.id] }),
	assignments: many(planFieldAssignments),
	comments: many(comments),
	reviews: many(reviews),
	shares: many(planShares)
}));

export const planFieldAssignments = pgTable(
	'plan_field_assignments',
	{
		planVersionId: uuid()
			.notNull()
			.references(() => planVersions.id, { onDelete: 'cascade' }),
		fieldId: uuid()
			.notNull()
			.references(() => fields.id, { onDelete: 'cascade' }),
		rotationId: uuid()
			.notNull()
			.references(() => rotations.id, { onDelete: 'restrict' }),
		/** 1 = the rotation's first practice in the plan's first year. */
		startingPhase: smallint().notNull()
	},
	(t) => [primaryKey({ columns: [t.planVersionId, t.fieldId] })]
);

export const planFieldAssignmentsRelations = relations(planFieldAssignments, ({ one }) => ({
	planVersion: one(planVersions, {
		fields: [planFieldAssignments.planVersionId],
		references: [planVersions.id]
	}),
	field: one(fields, { fields: [planFieldAssignments.fieldId], references: [fields.id] }),
	rotation: one(rotations, {
		fields: [planFieldAssignments.rotationId],
		references: [rotations.id]
	})
}));

export const comments = pgTable(
	'comments',
	{
		id: uuid().primaryKey().defaultRandom(),
		planVersionId: uuid()
			.notNull()
			.references(() => planVersions.id, { onDelete: 'cascade' }),
		authorId: uuid().references(() => users.id, { onDelete: 'set null' }),
		body: text().notNull(),
		createdAt: timestamp({ withTimezone: true }).notNull().defaultNow()
	},
	(t) => [index().on(t.planVersionId)]
);

export const commentsRelations = relations(comments, ({ one }) => ({
	planVersion: one(planVersions, {
		fields: [comments.planVersionId],
		references: [planVersions.id]
	}),
	author: one(users, { fields: [comments.authorId], references: [users.id] })
}));

export const reviews = pgTable(
	'reviews',
	{
		id: uuid().primaryKey().defaultRandom(),
		planVersionId: uuid()
			.notNull()
			.references(() => planVersions.id, { onDelete: 'cascade' }),
		reviewerId: uuid().references(() => users.id, { onDelete: 'set null' }),
		decision: reviewDecision().notNull(),
		note: text().notNull().default(''),
		createdAt: timestamp({ withTimezone: true }).notNull().defaultNow()
	},
	(t) => [index().on(t.planVersionId)]
);

export const reviewsRelations = relations(reviews, ({ one }) => ({
	planVersion: one(planVersions, {
		fields: [reviews.planVersionId],
		references: [planVersions.id]
	}),
	reviewer: one(users, { fields: [reviews.reviewerId], references: [users.id] })
}));

/**
 * A plan version shared for review by an owner or editor: from then it awaits a reviewer's decision.
 * Sharing the same version again (after changes were requested) adds a row; the newest counts.
 */
export const planShares = pgTable(
	'plan_shares',
	{
		id: uuid().primaryKey().defaultRandom(),
		planVersionId: uuid()
			.notNull()
			.references(() => planVersions.id, { onDelete: 'cascade' }),
		sharedById: uuid().references(() => users.id, { onDelete: 'set null' }),
		/** What the person sharing said to the reviewers ("Lower N on the east fields, as we discussed"). */
		message: text().notNull().default(''),
		createdAt: timestamp({ withTimezone: true }).notNull().defaultNow()
	},
	(t) => [index().on(t.planVersionId)]
);

export const planSharesRelations = relations(planShares, ({ one }) => ({
	planVersion: one(planVersions, {
		fields: [planShares.planVersionId],
		references: [planVersions.id]
	}),
	sharedBy: one(users, { fields: [planShares.sharedById], references: [users.id] })
}));
