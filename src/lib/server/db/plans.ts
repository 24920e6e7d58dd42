import { asc, eq } from 'drizzle-orm';
import type { Herd } from '$lib/schemas/plan-file';
import type { Db, Tx } from './client';
import { planFieldAssignments, plans, planVersions } from './schema';

/** A new plan as version 1: its horizon, the herd it runs, and a rotation for each field (row ids). */
export interface NewPlan {
	farmId: string;
	userId: string | null;
	name: string;
	isReference: boolean;
	startYear: number;
	years: number;
	assumptions: string[];
	herd: Herd | null;
	notes: string;
	fieldRotations: { fieldId: string; rotationId: string; startingPhase: number }[];
}

/** Saves a plan, its first version and its field assignments in one transaction. */
export async function insertPlan(db: Db | Tx, plan: NewPlan) {
	return db.transaction(async (tx) => {
		const [row] = await tx
			.insert(plans)
			.values({
				farmId: plan.farmId,
				name: plan.name,
				isReference: plan.isReference,
				createdById: plan.userId
			})
			.returning({ id: plans.id });
		const [version] = await tx
			.insert(planVersions)
			.values({
				planId: row.id,
				version: 1,
				startYear: plan.startYear,
				years: plan.years,
				assumptions: plan.assumptions,
				herd: plan.herd,
				notes: plan.notes,
				savedById: plan.userId
			})
			.returning({ id: planVersions.id });
		if (plan.fieldRotations.length) {
			await tx
				.insert(planFieldAssignments)
				.values(plan.fieldRotations.map((a) => ({ ...a, planVersionId: version.id })));
		}
		return { planId: row.id, planVersionId: version.id };
	});
}

/**
 * A plan with its farm and its current version, the version's fields and rotations assigned;
 * undefined when there is no such plan. `version` is undefined when the current one is missing.
 */
export async function findPlanWithCurrentVersion(db: Db | Tx, planId: string) {
	const plan = await db.query.plans.findFirst({
		where: eq(plans.id, planId),
		with: {
			farm: true,
			versions: { with: { assignments: { with: { field: true, rotation: true } } } }
		}
	});
	if (!plan) return undefined;
	const { versions, ...rest } = plan;
	return { ...rest, version: versions.find((v) => v.version === plan.currentVersion) };
}

/** The farm's plans by name, with the current version's horizon. */
export async function listPlansByFarm(db: Db | Tx, farmId: string) {
	const rows = await db.query.plans.findMany({
		columns: { id: true, name: true, isReference: true, currentVersion: true },
		where: eq(plans.farmId, farmId),
		orderBy: asc(plans.name),
		with: { versions: { columns: { version: true, startYear: true, years: true } } }
	});
	return rows.map(({ versions, ...plan }) => {
		const current = versions.find((v) => v.version === plan.currentVersion);
		return { ...plan, startYear: current?.startYear, years: current?.years };
	});
}
