import { relations, sql } from 'drizzle-orm';
import {
	bigint,
	bigserial,
	boolean,
	index,
	integer,
	jsonb,
	numeric,
	pgEnum,
	pgTable,
	primaryKey,
	smallint,
	text,
	timestamp,
	uniqueIndex,
	uuid,
	varchar
} from 'drizzle-orm/pg-core';
import type { Crop, Herd } from '../../schemas/plan-file';

/** Creation and update times, the same on every table that a person edits. */
const timestamps = {
	createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
	updatedAt: timestamp({ withTimezone: true })
		.notNull()
		.defaultNow()
		.$onUpdate(() => new Date())
};

/** The farm a row belongs to; it goes when the farm goes. */
const farmReference = () =>
	uuid()
		.notNull()
		.references(() => farms.id, { onDelete: 'cascade' });

export const farmRole = pgEnum('farm_role', ['owner', 'editor', 'reviewer']);
export const unitSystem = pgEnum('unit_system', ['us', 'metric']);
export const reviewDecision = pgEnum('review_decision', ['approved', 'changes_requested']);

// ---- People and sign-in (Auth.js tables keep the names its Drizzle adapter expects) ----

export const users = pgTable('users', {
	id: uuid().primaryKey().defaultRandom(),
	name: text(),
	email: text().notNull().unique(),
	emailVerified: timestamp({ withTimezone: true, mode: 'date' }),
	image: text(),
	/** argon2id hash; null for people who have only been invited. */
	passwordHash: text(),
	isSiteAdmin: boolean().notNull().default(false),
	...timestamps
});

export const accounts = pgTable(
	'accounts',
	{
		userId: uuid()
			.notNull()
			.references(() => users.id, { onDelete: 'cascade' }),
		type: text().$type<'email' | 'oauth' | 'oidc' | 'webauthn'>().notNull(),
		provider: text().notNull(),
		providerAccountId: text().notNull(),
		refresh_token: text('refresh_token'),
		access_token: text('access_token'),
		expires_at: integer('expires_at'),
		token_type: text('token_type'),
		scope: text(),
		id_token: text('id_token'),
		session_state: text('session_state')
	},
	(t) => [primaryKey({ columns: [t.provider, t.providerAccountId] })]
);

export const sessions = pgTable('sessions', {
	sessionToken: text().primaryKey(),
	userId: uuid()
		.notNull()
		.references(() => users.id, { onDelete: 'cascade' }),
	expires: timestamp({ withTimezone: true, mode: 'date' }).notNull()
});

export const verificationTokens = pgTable(
	'verification_tokens',
	{
		identifier: text().notNull(),
		token: text().notNull(),
		expires: timestamp({ withTimezone: true, mode: 'date' }).notNull()
	},
	(t) => [primaryKey({ columns: [t.identifier, t.token] })]
);

/** Failed sign-in counters, the table rate-limiter-flexible's PostgreSQL store reads and writes. */
export const signInLimits = pgTable('sign_in_limits', {
	key: varchar({ length: 255 }).primaryKey(),
	points: integer().notNull().default(0),
	expire: bigint({ mode: 'number' })
});

// ---- Farms and who may see them ----

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
		...timestamps
	},
	(t) => [index().on(t.farmId), index().on(t.email)]
);

// ---- What the farm has. Each part keeps the plan file's id as `key`, so files round-trip. ----

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
		notes: text().notNull().default(''),
		...timestamps
	},
	(t) => [uniqueIndex().on(t.farmId, t.key)]
);

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

export const operationBy = pgEnum('operation_by', ['own', 'custom']);
export const fuelBasis = pgEnum('fuel_basis', ['per-acre', 'pto-power']);

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
		speedMph: numeric({ mode: 'number', precision: 5, scale: 2 }),
		widthFt: numeric({ mode: 'number', precision: 6, scale: 2 }),
		fieldEfficiencyPercent: numeric({ mode: 'number', precision: 5, scale: 2 }),
		fuelBasis: fuelBasis(),
		dieselGallonsPerAcre: numeric({ mode: 'number', precision: 6, scale: 3 }),
		tractorMaxPtoHp: numeric({ mode: 'number', precision: 6, scale: 1 }),
		dieselGallonsPerHpHour: numeric({ mode: 'number', precision: 6, scale: 4 }),
		labourFactor: numeric({ mode: 'number', precision: 4, scale: 2 }),
		repairsUsdPerAcre: numeric({ mode: 'number', precision: 8, scale: 2 }),
		...timestamps
	},
	(t) => [uniqueIndex().on(t.farmId, t.key)]
);

/** One year of one crop: what it costs, what it yields, what it leaves and what it offers for grazing. */
export const cropPractices = pgTable(
	'crop_practices',
	{
		id: uuid().primaryKey().defaultRandom(),
		farmId: farmReference(),
		key: text().notNull(),
		name: text().notNull(),
		crop: text().$type<Crop>().notNull(),
		/** bu/ac for grains, tons/ac for forages. */
		yieldGoalPerAcre: numeric({ mode: 'number', precision: 10, scale: 2 }).notNull(),
		otherFertiliserUsdPerAcre: numeric({ mode: 'number', precision: 8, scale: 2 }).notNull(),
		chemicalsUsdPerAcre: numeric({ mode: 'number', precision: 8, scale: 2 }).notNull(),
		/** Drying, hauling, crop insurance and the like. */
		otherDirectUsdPerAcre: numeric({ mode: 'number', precision: 8, scale: 2 }).notNull(),
		/** The rest as the plan file states it: seed, N rate and response, cover mix, credits, grazing. */
		detail: jsonb().$type<Record<string, unknown>>().notNull(),
		...timestamps
	},
	(t) => [uniqueIndex().on(t.farmId, t.key)]
);

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

// ---- Plans, their versions and reviews ----

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
		 * The herd as this plan runs it (grazing season, manure credit…), starting from the farm's herd;
		 * null: the plan keeps no cattle. Stated as the plan file's `herd`.
		 */
		herd: jsonb().$type<Herd>(),
		notes: text().notNull().default(''),
		savedById: uuid().references(() => users.id, { onDelete: 'set null' }),
		createdAt: timestamp({ withTimezone: true }).notNull().defaultNow()
	},
	(t) => [uniqueIndex().on(t.planId, t.version)]
);

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

export const auditLog = pgTable(
	'audit_log',
	{
		id: bigserial({ mode: 'number' }).primaryKey(),
		farmId: uuid().references(() => farms.id, { onDelete: 'cascade' }),
		userId: uuid().references(() => users.id, { onDelete: 'set null' }),
		action: text().notNull(),
		detail: jsonb().$type<Record<string, unknown>>().notNull().default({}),
		createdAt: timestamp({ withTimezone: true }).notNull().defaultNow()
	},
	(t) => [index().on(t.farmId, t.createdAt)]
);

// ---- Relations ----

export const usersRelations = relations(users, ({ many }) => ({ memberships: many(memberships) }));
export const farmsRelations = relations(farms, ({ many }) => ({
	memberships: many(memberships),
	fields: many(fields),
	herds: many(herds),
	priceSets: many(priceSets),
	fieldOperations: many(fieldOperations),
	cropPractices: many(cropPractices),
	rotations: many(rotations),
	plans: many(plans)
}));
export const membershipsRelations = relations(memberships, ({ one }) => ({
	farm: one(farms, { fields: [memberships.farmId], references: [farms.id] }),
	user: one(users, { fields: [memberships.userId], references: [users.id] })
}));
export const fieldsRelations = relations(fields, ({ one }) => ({
	farm: one(farms, { fields: [fields.farmId], references: [farms.id] })
}));
export const herdsRelations = relations(herds, ({ one }) => ({
	farm: one(farms, { fields: [herds.farmId], references: [farms.id] })
}));
export const priceSetsRelations = relations(priceSets, ({ one, many }) => ({
	farm: one(farms, { fields: [priceSets.farmId], references: [farms.id] }),
	items: many(priceSetItems)
}));
export const priceSetItemsRelations = relations(priceSetItems, ({ one }) => ({
	priceSet: one(priceSets, { fields: [priceSetItems.priceSetId], references: [priceSets.id] })
}));
export const fieldOperationsRelations = relations(fieldOperations, ({ one }) => ({
	farm: one(farms, { fields: [fieldOperations.farmId], references: [farms.id] })
}));
export const cropPracticesRelations = relations(cropPractices, ({ one, many }) => ({
	farm: one(farms, { fields: [cropPractices.farmId], references: [farms.id] }),
	operations: many(practiceOperations)
}));
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
export const rotationsRelations = relations(rotations, ({ one, many }) => ({
	farm: one(farms, { fields: [rotations.farmId], references: [farms.id] }),
	steps: many(rotationSteps)
}));
export const rotationStepsRelations = relations(rotationSteps, ({ one }) => ({
	rotation: one(rotations, { fields: [rotationSteps.rotationId], references: [rotations.id] }),
	practice: one(cropPractices, {
		fields: [rotationSteps.practiceId],
		references: [cropPractices.id]
	})
}));
export const plansRelations = relations(plans, ({ one, many }) => ({
	farm: one(farms, { fields: [plans.farmId], references: [farms.id] }),
	versions: many(planVersions)
}));
export const planVersionsRelations = relations(planVersions, ({ one, many }) => ({
	plan: one(plans, { fields: [planVersions.planId], references: [plans.id] }),
	assignments: many(planFieldAssignments),
	comments: many(comments),
	reviews: many(reviews)
}));
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
export const commentsRelations = relations(comments, ({ one }) => ({
	planVersion: one(planVersions, {
		fields: [comments.planVersionId],
		references: [planVersions.id]
	}),
	author: one(users, { fields: [comments.authorId], references: [users.id] })
}));
export const reviewsRelations = relations(reviews, ({ one }) => ({
	planVersion: one(planVersions, {
		fields: [reviews.planVersionId],
		references: [planVersions.id]
	}),
	reviewer: one(users, { fields: [reviews.reviewerId], references: [users.id] })
}));
