// The reviewer's home: every plan of every farm they review, what waits for them first, each with its
// net return and its partial budget's average change against the farm's reference plan.
import { reviewStateOrder, type ReviewState } from '$lib/review-state';
import type { Db } from '$lib/server/db/client';
import { listFarmsByIds } from '$lib/server/db/farms';
import { findReferencePlan, listPlansForFarms } from '$lib/server/db/plans';
import { notShared, reviewStatesOfPlans } from '$lib/server/db/reviews';
import { averageNetReturnUsd, evaluateStoredPlan } from './plan-report';

export interface ReviewerPlanRow {
	farmId: string;
	farmName: string;
	planId: string;
	planName: string;
	isReference: boolean;
	/** The version shown: the newest one shared for review, else the newest. */
	version: number;
	currentVersion: number;
	state: ReviewState;
	by: string | null;
	at: Date | null;
	/** Average net return a year, $; null when the version cannot be worked out now. */
	netReturnUsdPerYear: number | null;
	/** The partial budget's average net change a year against the reference plan, $; null without one. */
	netChangeUsdPerYear: number | null;
	problem: string | null;
}

/**
 * The plans of the farms with these ids, awaiting review first (the longest waiting first), then
 * changes requested, not yet shared and approved, each group by farm and plan name.
 */
export async function listPlansForReviewer(db: Db, farmIds: string[]): Promise<ReviewerPlanRow[]> {
	if (!farmIds.length) return [];
	const plans = await listPlansForFarms(db, farmIds);
	const [states, farms, references] = await Promise.all([
		reviewStatesOfPlans(
			db,
			plans.map((p) => p.id)
		),
		listFarmsByIds(db, farmIds),
		Promise.all(farmIds.map((id) => findReferencePlan(db, id)))
	]);
	const farmById = new Map(farms.map((farm) => [farm.id, farm]));
	const referenceByFarm = new Map(farmIds.map((id, i) => [id, references[i] ?? null]));
	const rows: ReviewerPlanRow[] = [];
	for (const plan of plans) {
		const farm = farmById.get(plan.farmId);
		if (!farm) continue;
		const versions = states.get(plan.id) ?? new Map();
		const sharedVersions = [...versions.keys()].sort((a, b) => b - a);
		const version = sharedVersions[0] ?? plan.currentVersion;
		const state = versions.get(version) ?? notShared;
		const evaluation = await evaluateStoredPlan(
			db,
			farm,
			plan,
			version,
			referenceByFarm.get(farm.id)
		);
		rows.push({
			farmId: farm.id,
			farmName: farm.name,
			planId: plan.id,
			planName: plan.name,
			isReference: plan.isReference,
			version,
			currentVersion: plan.currentVersion,
			...state,
			netReturnUsdPerYear: evaluation.ok ? averageNetReturnUsd(evaluation.summary) : null,
			netChangeUsdPerYear: evaluation.ok
				? (evaluation.summary.partialBudget?.average.netChangeUsd ?? null)
				: null,
			problem: evaluation.ok ? null : evaluation.message
		});
	}
	return rows.sort(
		(a, b) =>
			reviewStateOrder[a.state] - reviewStateOrder[b.state] ||
			(a.state === 'awaiting_review' ? (a.at?.getTime() ?? 0) - (b.at?.getTime() ?? 0) : 0) ||
			a.farmName.localeCompare(b.farmName) ||
			a.planName.localeCompare(b.planName) ||
			// Farms and plans may share names: the ids keep such rows where they were.
			a.farmId.localeCompare(b.farmId) ||
			a.planId.localeCompare(b.planId)
	);
}
