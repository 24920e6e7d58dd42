// A stored plan version evaluated on its farm, with its partial budget against the farm's reference
// plan when that plan covers its years: what the printable report and the reviewer's home show.
import {
	evaluatePlan,
	NonFiniteResultError,
	referenceHorizonIssues,
	summarisePlan,
	type PlanSummary
} from '$lib/engine';
import type { PlanDocument } from '$lib/schemas/plan-file';
import { readAll, type Db, type Tx } from '$lib/server/db/client';
import { findReferencePlan, type PlanRow } from '$lib/server/db/plans';
import type { farms } from '$lib/server/db/schema';
import { checkDraft, findDraft } from '$lib/server/plans';

type Farm = typeof farms.$inferSelect;

export type StoredPlanEvaluation =
	| {
			ok: true;
			document: PlanDocument;
			summary: PlanSummary;
			/** The reference plan's newest version, when the budget is against it. */
			reference: { planId: string; document: PlanDocument } | null;
	  }
	| { ok: false; message: string };

/**
 * A version of the plan evaluated on the farm as it is now; with the farm's reference plan (another
 * plan, its newest version, covering the same years) the partial budget against it. A version that no
 * longer makes a valid plan, or gives a result that is not a number, answers why.
 */
export async function evaluateStoredPlan(
	db: Db | Tx,
	farm: Farm,
	plan: PlanRow,
	version: number,
	referencePlan?: PlanRow | null
): Promise<StoredPlanEvaluation> {
	const reference =
		referencePlan === undefined ? await findReferencePlan(db, farm.id) : referencePlan;
	const [draft, referenceDraft] = await readAll(db, [
		() => findDraft(db, plan, version),
		() => (reference && reference.id !== plan.id ? findDraft(db, reference) : undefined)
	]);
	if (!draft) return { ok: false, message: `This plan has no version ${version}.` };
	const [checked, referenceChecked] = await readAll(db, [
		() => checkDraft(db, farm, draft),
		() => (referenceDraft ? checkDraft(db, farm, referenceDraft) : undefined)
	]);
	if (!checked.ok) {
		return {
			ok: false,
			message: `Version ${version} no longer makes a valid plan with the farm's data: ${checked.issues
				.slice(0, 3)
				.map((i) => i.message)
				.join(' ')}`
		};
	}
	const against =
		referenceChecked?.ok &&
		!referenceHorizonIssues(checked.document, referenceChecked.document).length
			? referenceChecked.document
			: undefined;
	try {
		const summary = summarisePlan(evaluatePlan(checked.document, against));
		return {
			ok: true,
			document: checked.document,
			summary,
			reference: against && reference ? { planId: reference.id, document: against } : null
		};
	} catch (error) {
		if (!(error instanceof NonFiniteResultError)) throw error;
		return { ok: false, message: 'The plan gives a result that is not a number.' };
	}
}

/** Net return averaged over the plan's years, $ per year. */
export function averageNetReturnUsd(summary: PlanSummary): number {
	const years = summary.farmYears;
	return years.reduce((sum, fy) => sum + fy.netReturnUsd, 0) / Math.max(1, years.length);
}
