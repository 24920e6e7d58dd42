import { and, asc, desc, eq, inArray, sql } from 'drizzle-orm';
import type { Herd, PlanAdjustment } from '$lib/schemas/plan-file';
import type { StoredAdjustment } from './schema/plans';
import { insertAuditEntry } from './audit';
import { readAll, type Db, type Tx } from './client';
import { isRowId } from './keys';
import { lockFarm } from './people';
import { cropPractices, fields, planFieldAssignments, plans, planVersions, users } from './schema';

/** The farm's plans by name, with the current version's horizon. */
export async function listPlansByFarm(db: Db | Tx, farmId: string) {
	const rows = await db.query.plans.findMany({
		columns: { id: true, name: true, isReference: true, currentVersion: true },
		where: eq(plans.farmId, farmId),
		// Names need not differ (copies, imports): the id keeps two of one name in the same order.
		orderBy: [asc(plans.name), asc(plans.id)],
		with: { versions: { columns: { version: true, startYear: true, years: true } } }
	});
	return rows.map(({ versions, ...plan }) => {
		const current = versions.find((v) => v.version === plan.currentVersion);
		return { ...plan, startYear: current?.startYear, years: current?.years };
	});
}

/** What a version holds: its horizon, assumptions, herd, notes and each field's rotation (row ids). */
export interface PlanVersionContent {
	startYear: number;
	years: number;
	assumptions: string[];
	adjustments: StoredAdjustment[];
	herd: Herd | null;
	notes: string;
	fieldRotations: { fieldId: string; rotationId: string; startingPhase: number }[];
}

/** The farm's plan by id; undefined for another farm's plan or an id that is not a UUID. */
export async function findPlan(db: Db | Tx, farmId: string, planId: string) {
	if (!isRowId(planId)) return undefined;
	return db.query.plans.findFirst({ where: and(eq(plans.id, planId), eq(plans.farmId, farmId)) });
}

export type PlanRow = NonNullable<Awaited<ReturnType<typeof findPlan>>>;

/** One version of a plan with its fields' rotations by plan-file key; undefined when there is none. */
export async function findPlanVersion(db: Db | Tx, planId: string, version: number) {
	const row = await db.query.planVersions.findFirst({
		where: and(eq(planVersions.planId, planId), eq(planVersions.version, version)),
		with: {
			assignments: {
				with: {
					field: { columns: { key: true, name: true } },
					rotation: { columns: { key: true } }
				}
			}
		}
	});
	if (!row) return undefined;
	const { assignments, adjustments, ...rest } = row;
	return {
		...rest,
		adjustments: await adjustmentsByKey(db, adjustments),
		fieldRotations: assignments
			.map((a) => ({
				fieldId: a.field.key,
				rotationId: a.rotation.key,
				startingPhase: a.startingPhase
			}))
			.sort((a, b) => a.fieldId.localeCompare(b.fieldId))
	};
}

/** Stored adjustments as the plan file states them: fields and practices by their keys now. */
async function adjustmentsByKey(
	db: Db | Tx,
	stored: StoredAdjustment[]
): Promise<PlanAdjustment[]> {
	if (!stored.length) return [];
	const ids = (pick: (a: StoredAdjustment) => string | undefined) =>
		stored.map(pick).filter((id): id is string => id !== undefined);
	const [fieldRows, practiceRows] = await readAll(db, [
		() =>
			keysOf(
				db,
				fields,
				ids((a) => a.fieldRowId)
			),
		() =>
			keysOf(
				db,
				cropPractices,
				ids((a) => a.practiceRowId)
			)
	]);
	// A field or practice deleted since must not widen the change to every one: it names a key that no
	// farm part has, which the plan file's checks refuse.
	return stored.map(({ fieldRowId, practiceRowId, ...change }) => ({
		...(fieldRowId === undefined
			? {}
			: { fieldId: fieldRows.get(fieldRowId) ?? 'a-deleted-field' }),
		...(practiceRowId === undefined
			? {}
			: { practiceId: practiceRows.get(practiceRowId) ?? 'a-deleted-practice' }),
		...change
	}));
}

async function keysOf(db: Db | Tx, table: typeof fields | typeof cropPractices, ids: string[]) {
	if (!ids.length) return new Map<string, string>();
	const rows = await db
		.select({ id: table.id, key: table.key })
		.from(table)
		.where(inArray(table.id, ids));
	return new Map(rows.map((r) => [r.id, r.key]));
}

/** Plan-file adjustments with their fields and practices by row id (keys the maps lack are dropped). */
export function storedAdjustments(
	adjustments: PlanAdjustment[],
	fieldIds: Map<string, string>,
	practiceIds: Map<string, string>
): StoredAdjustment[] {
	return adjustments.map(({ fieldId, practiceId, ...change }) => ({
		...(fieldId === undefined ? {} : { fieldRowId: fieldIds.get(fieldId) }),
		...(practiceId === undefined ? {} : { practiceRowId: practiceIds.get(practiceId) }),
		...change
	}));
}

/** Every version of a plan, newest first, with who saved it, when and what they said. */
export async function listPlanVersions(db: Db | Tx, planId: string) {
	const rows = await db
		.select({
			version: planVersions.version,
			savedAt: planVersions.createdAt,
			changeNote: planVersions.changeNote,
			restoredFromVersion: planVersions.restoredFromVersion,
			startYear: planVersions.startYear,
			years: planVersions.years,
			savedByName: users.name,
			savedByEmail: users.email
		})
		.from(planVersions)
		.leftJoin(users, eq(users.id, planVersions.savedById))
		.where(eq(planVersions.planId, planId))
		.orderBy(desc(planVersions.version));
	return rows.map(({ savedByName, savedByEmail, ...row }) => ({
		...row,
		savedBy: savedByName ?? savedByEmail ?? 'a removed account'
	}));
}

async function insertVersion(
	tx: Tx,
	planId: string,
	version: number,
	userId: string | null,
	content: PlanVersionContent,
	extra: { changeNote: string; restoredFromVersion?: number }
) {
	const { fieldRotations, ...columns } = content;
	const [row] = await tx
		.insert(planVersions)
		.values({ planId, version, savedById: userId, ...columns, ...extra })
		.returning({ id: planVersions.id });
	if (fieldRotations.length) {
		await tx
			.insert(planFieldAssignments)
			.values(fieldRotations.map((a) => ({ ...a, planVersionId: row.id })));
	}
	return row.id;
}

export type SaveOutcome =
	{ saved: true; version: number } | { saved: false; currentVersion: number };

/**
 * Saves a new version of a plan edited from `baseVersion`. The plan row's version moves on only when it
 * still is `baseVersion` (the update waits for a concurrent save and then sees its number), so of two
 * saves from the same version exactly one wins; the other changes nothing and learns the newest version.
 */
export async function savePlanVersion(
	db: Db | Tx,
	save: {
		farmId: string;
		planId: string;
		userId: string | null;
		baseVersion: number;
		name: string;
		content: PlanVersionContent;
		changeNote: string;
		restoredFromVersion?: number;
	}
): Promise<SaveOutcome> {
	return db.transaction(async (tx) => {
		const [moved] = await tx
			.update(plans)
			.set({
				currentVersion: sql`${plans.currentVersion} + 1`,
				name: save.name,
				updatedAt: new Date()
			})
			.where(
				and(
					eq(plans.id, save.planId),
					eq(plans.farmId, save.farmId),
					eq(plans.currentVersion, save.baseVersion)
				)
			)
			.returning({ version: plans.currentVersion });
		if (!moved) {
			const current = await findPlan(tx, save.farmId, save.planId);
			return { saved: false, currentVersion: current?.currentVersion ?? 0 };
		}
		await insertVersion(tx, save.planId, moved.version, save.userId, save.content, {
			changeNote: save.changeNote,
			restoredFromVersion: save.restoredFromVersion
		});
		const saved = { planId: save.planId, name: save.name, version: moved.version };
		await (save.restoredFromVersion === undefined
			? insertAuditEntry(tx, {
					farmId: save.farmId,
					userId: save.userId,
					action: 'plan.saved',
					detail: saved
				})
			: insertAuditEntry(tx, {
					farmId: save.farmId,
					userId: save.userId,
					action: 'plan.restored',
					detail: { ...saved, fromVersion: save.restoredFromVersion }
				}));
		return { saved: true, version: moved.version };
	});
}

/**
 * A new plan as version 1 from a plan's content (a copy, a plan made in the editor, or an imported plan
 * file, audited as such), with its field assignments and audit entry in one transaction.
 */
export async function createPlan(
	db: Db | Tx,
	plan: {
		farmId: string;
		userId: string | null;
		name: string;
		content: PlanVersionContent;
		changeNote: string;
		isReference?: boolean;
		action?: 'plan.created' | 'plan.imported';
	}
) {
	return db.transaction(async (tx) => {
		const [row] = await tx
			.insert(plans)
			.values({
				farmId: plan.farmId,
				name: plan.name,
				isReference: plan.isReference ?? false,
				createdById: plan.userId
			})
			.returning({ id: plans.id });
		await insertVersion(tx, row.id, 1, plan.userId, plan.content, { changeNote: plan.changeNote });
		await insertAuditEntry(tx, {
			farmId: plan.farmId,
			userId: plan.userId,
			action: plan.action ?? 'plan.created',
			detail: { planId: row.id, name: plan.name }
		});
		return { planId: row.id, version: 1 };
	});
}

/** A new plan holding a copy of a plan's newest version, under its own name. */
export async function copyPlan(
	db: Db | Tx,
	copy: { farmId: string; userId: string; plan: PlanRow; name: string }
) {
	const { farmId, userId, plan, name } = copy;
	const content = await findVersionContent(db, plan.id, plan.currentVersion);
	if (!content) throw new Error(`Plan ${plan.id} has no version ${plan.currentVersion}`);
	return createPlan(db, {
		farmId,
		userId,
		name,
		content,
		changeNote: `Copied from "${plan.name}" version ${plan.currentVersion}`
	});
}

/** A version's content with row ids, to copy or restore it. */
export async function findVersionContent(
	db: Db | Tx,
	planId: string,
	version: number
): Promise<PlanVersionContent | undefined> {
	const row = await db.query.planVersions.findFirst({
		where: and(eq(planVersions.planId, planId), eq(planVersions.version, version)),
		with: { assignments: true }
	});
	if (!row) return undefined;
	return {
		startYear: row.startYear,
		years: row.years,
		assumptions: row.assumptions,
		adjustments: row.adjustments,
		herd: row.herd ?? null,
		notes: row.notes,
		fieldRotations: row.assignments.map(({ fieldId, rotationId, startingPhase }) => ({
			fieldId,
			rotationId,
			startingPhase
		}))
	};
}

/**
 * Deletes a plan with its versions and reviews, unless it is the farm's reference plan when the delete
 * runs (the farm is locked, so a plan made the reference meanwhile is kept); whether it was deleted.
 */
export async function deletePlan(db: Db | Tx, farmId: string, userId: string, plan: PlanRow) {
	return db.transaction(async (tx) => {
		await lockFarm(tx, farmId);
		const deleted = await tx
			.delete(plans)
			.where(and(eq(plans.id, plan.id), eq(plans.farmId, farmId), eq(plans.isReference, false)))
			.returning({ id: plans.id });
		if (!deleted.length) return false;
		await insertAuditEntry(tx, {
			farmId,
			userId,
			action: 'plan.deleted',
			detail: { planId: plan.id, name: plan.name }
		});
		return true;
	});
}

/** Makes a plan the farm's one reference plan (the one every partial budget is against by default). */
export async function makeReferencePlan(
	db: Db | Tx,
	farmId: string,
	userId: string,
	plan: PlanRow
) {
	await db.transaction(async (tx) => {
		// Two plans made the reference at once: the second waits, then finds the first's reference.
		await lockFarm(tx, farmId);
		await tx
			.update(plans)
			.set({ isReference: false })
			.where(and(eq(plans.farmId, farmId), eq(plans.isReference, true)));
		await tx
			.update(plans)
			.set({ isReference: true })
			.where(and(eq(plans.id, plan.id), eq(plans.farmId, farmId)));
		await insertAuditEntry(tx, {
			farmId,
			userId,
			action: 'plan.made-reference',
			detail: { planId: plan.id, name: plan.name }
		});
	});
}

/** The farm's reference plan, when it has one. */
export async function findReferencePlan(db: Db | Tx, farmId: string) {
	return db.query.plans.findFirst({
		where: and(eq(plans.farmId, farmId), eq(plans.isReference, true))
	});
}

/** The plans of several farms (a reviewer's), with the row fields a plan guard returns. */
export async function listPlansForFarms(db: Db | Tx, farmIds: string[]): Promise<PlanRow[]> {
	if (!farmIds.length) return [];
	return db.query.plans.findMany({ where: inArray(plans.farmId, farmIds) });
}
