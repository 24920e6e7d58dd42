import type { PlanSummary } from '$lib/engine';
import type { FieldIssue } from '$lib/schemas/issues';
import { requireFarmAccess, roleAllows } from '$lib/server/auth/access';
import { shownScales } from '$lib/server/display-units';
import { db } from '$lib/server/db';
import { findPlan, findReferencePlan, listPlansByFarm } from '$lib/server/db/plans';
import { draftResults, findDraft } from '$lib/server/plans';
import type { PageServerLoad } from './$types';

const maxCompared = 4;

// Two to four saved plans side by side, each with its partial budget against the farm's reference plan.
export const load = (async (event) => {
	const { farm, role } = await requireFarmAccess(event, event.params.farmId, 'farm:view');
	const asked = [
		...new Set(
			event.url.searchParams
				.getAll('plans')
				.flatMap((value) => value.split(','))
				.filter(Boolean)
		)
	].slice(0, maxCompared);
	const [reference, plans] = await Promise.all([
		findReferencePlan(db, farm.id),
		listPlansByFarm(db, farm.id)
	]);
	const referenceDraft = reference && (await findDraft(db, reference));
	const compared: {
		id: string;
		name: string;
		isReference: boolean;
		version: number;
		summary: PlanSummary | null;
		problem: string;
		issues: FieldIssue[];
	}[] = [];
	for (const planId of asked) {
		const plan = await findPlan(db, farm.id, planId);
		const draft = plan && (await findDraft(db, plan));
		if (!plan || !draft) continue;
		const answer = await draftResults(db, farm, draft, {
			against: plan.isReference ? undefined : referenceDraft,
			detail: 'summary'
		});
		const failed = answer.ok ? null : await answer.response.json();
		compared.push({
			id: plan.id,
			name: plan.name,
			isReference: plan.isReference,
			version: plan.currentVersion,
			summary: answer.ok ? (answer.result as PlanSummary) : null,
			problem: failed?.message ?? '',
			issues: failed?.issues ?? []
		});
	}
	return {
		farm: { id: farm.id, name: farm.name, unitSystem: farm.unitSystem },
		canEdit: roleAllows(role, 'plan:edit'),
		scales: shownScales(farm.unitSystem),
		reference: reference && { id: reference.id, name: reference.name },
		plans: plans.map((p) => ({ id: p.id, name: p.name })),
		compared
	};
}) satisfies PageServerLoad;
