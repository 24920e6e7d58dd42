// What the plans API and the plan pages share: a draft checked as the plan file it makes on its farm,
// turned into a version's rows, and evaluated (with a partial budget against another plan).
import { json } from '@sveltejs/kit';
import type { z } from 'zod';
import {
	evaluatePlan,
	NonFiniteResultError,
	referenceHorizonIssues,
	summarisePlan,
	type PlanResult,
	type PlanSummary
} from '$lib/engine';
import type { FieldIssue } from '$lib/schemas/issues';
import { parsePlanDocument, type PlanDocument } from '$lib/schemas/plan-file';
import type { PlanDraft, ResultsQuery } from '$lib/schemas/plans';
import { invalidInput, readJson } from '$lib/server/api';
import { readAll, type Db, type Tx } from '$lib/server/db/client';
import { findIdsByKey } from '$lib/server/db/keys';
import {
	draftOfVersion,
	draftPlanDocument,
	importPlanDocument
} from '$lib/server/db/plan-documents';
import {
	findPlan,
	findPlanVersion,
	storedAdjustments,
	type PlanRow,
	type PlanVersionContent
} from '$lib/server/db/plans';
import { cropPractices, fields, rotations, type farms } from '$lib/server/db/schema';

type Farm = typeof farms.$inferSelect;
type Checked = { ok: true; document: PlanDocument } | { ok: false; issues: FieldIssue[] };

/**
 * A draft as the plan file it makes with the farm's data, validated. Issue paths name the draft's own
 * values (`plan.fieldRotations.2.rotationId`, `herd.head`) or the farm's part that is missing
 * (`priceSets`: no prices for a plan year).
 */
export async function checkDraft(db: Db | Tx, farm: Farm, draft: PlanDraft): Promise<Checked> {
	const parsed = parsePlanDocument(await draftPlanDocument(db, farm, draft));
	return parsed.ok ? { ok: true, document: parsed.plan } : parsed;
}

/** A checked draft as a version's rows: fields and rotations by row id. */
export async function versionContent(
	db: Db | Tx,
	farmId: string,
	draft: PlanDraft
): Promise<PlanVersionContent> {
	const { fieldRotations, horizon, assumptions, adjustments } = draft.plan;
	const [fieldIds, rotationIds, practiceIds] = await readAll(db, [
		() =>
			findIdsByKey(
				db,
				fields,
				farmId,
				fieldRotations.map((a) => a.fieldId)
			),
		() =>
			findIdsByKey(
				db,
				rotations,
				farmId,
				fieldRotations.map((a) => a.rotationId)
			),
		() =>
			findIdsByKey(
				db,
				cropPractices,
				farmId,
				adjustments.flatMap((a) => (a.practiceId === undefined ? [] : [a.practiceId]))
			)
	]);
	return {
		startYear: horizon.startYear,
		years: horizon.years,
		assumptions,
		adjustments: storedAdjustments(adjustments, fieldIds, practiceIds),
		herd: draft.herd,
		notes: draft.notes,
		fieldRotations: fieldRotations.map((a) => ({
			fieldId: fieldIds.get(a.fieldId)!,
			rotationId: rotationIds.get(a.rotationId)!,
			startingPhase: a.startingPhase
		}))
	};
}

/**
 * A stored version checked against the farm as it is now (a rotation may have been shortened since):
 * what a copy or a restore must pass before it becomes a plan's newest version.
 */
export async function checkVersion(
	db: Db | Tx,
	farm: Farm,
	plan: PlanRow,
	version: number
): Promise<Checked | undefined> {
	const draft = await findDraft(db, plan, version);
	return draft && checkDraft(db, farm, draft);
}

/** A plan file's plan, refused with its issues once imported, so the transaction saves nothing. */
class ImportRefused extends Error {
	constructor(readonly issues: FieldIssue[]) {
		super('The imported plan does not evaluate on this farm');
	}
}

/**
 * Imports a validated plan file into the farm in one transaction, then checks the plan as the farm now
 * holds it: parts the farm had under the same ids were kept, and the plan must still make sense with
 * them. When it does not, nothing is saved and the issues say why.
 */
export async function importCheckedPlan(
	db: Db,
	farm: Farm,
	userId: string,
	doc: PlanDocument
): Promise<{ ok: true; planId: string } | { ok: false; issues: FieldIssue[] }> {
	try {
		const planId = await db.transaction(async (tx) => {
			const saved = await importPlanDocument(tx, {
				farmId: farm.id,
				userId,
				doc,
				isReference: false
			});
			const plan = (await findPlan(tx, farm.id, saved.planId))!;
			const checked = await checkVersion(tx, farm, plan, 1);
			if (!checked?.ok) throw new ImportRefused(checked?.issues ?? []);
			return saved.planId;
		});
		return { ok: true, planId };
	} catch (error) {
		if (error instanceof ImportRefused) return { ok: false, issues: error.issues };
		throw error;
	}
}

/** A plan's version as a draft; undefined when the plan has no such version. */
export async function findDraft(db: Db | Tx, plan: PlanRow, version = plan.currentVersion) {
	const stored = await findPlanVersion(db, plan.id, version);
	return stored && draftOfVersion(plan.name, stored);
}

/** The plan's newest version as the plan file it makes on its farm, or the 422 saying why it cannot. */
export async function storedPlanDocument(
	db: Db | Tx,
	farm: Farm,
	plan: PlanRow
): Promise<{ ok: true; document: PlanDocument } | { ok: false; response: Response }> {
	const draft = await findDraft(db, plan);
	const checked = draft ? await checkDraft(db, farm, draft) : null;
	if (checked?.ok) return checked;
	return refused('The plan is not valid.', checked?.issues ?? []);
}

/**
 * A request on the plan's newest version with a JSON body for `schema` (the optimiser's routes): the
 * parsed body and the plan file, or the 400/413/422 answer naming what is wrong.
 */
export async function planDocumentRequest<T extends z.ZodType>(
	db: Db | Tx,
	farm: Farm,
	plan: PlanRow,
	request: Request,
	schema: T
): Promise<
	{ ok: true; body: z.output<T>; document: PlanDocument } | { ok: false; response: Response }
> {
	const body = await readJson(request);
	if (!body.ok) return body;
	const parsed = schema.safeParse(body.body);
	if (!parsed.success) return { ok: false, response: invalidInput(parsed.error) };
	const stored = await storedPlanDocument(db, farm, plan);
	return stored.ok ? { ok: true, body: parsed.data, document: stored.document } : stored;
}

export type ResultsAnswer =
	{ ok: true; result: PlanResult | PlanSummary } | { ok: false; response: Response };

function refused(message: string, issues: FieldIssue[]) {
	return { ok: false as const, response: json({ message, issues }, { status: 422 }) };
}

/**
 * The engine's results for a draft: the summary the editor shows, or every field-year with `full`
 * (only one field's, or one field-year, with `field` and `year`);
 * with `against`, the partial budget of the draft against that plan. A draft that does not make a valid
 * plan, a plan to compare with that does not cover the draft's years, or a result that would not be a
 * finite number: 422 naming each problem.
 */
export async function draftResults(
	db: Db | Tx,
	farm: Farm,
	draft: PlanDraft,
	{
		against,
		detail,
		field,
		year
	}: { against?: PlanDraft } & Pick<ResultsQuery, 'detail' | 'field' | 'year'>
): Promise<ResultsAnswer> {
	const [plan, reference] = await readAll(db, [
		() => checkDraft(db, farm, draft),
		() => (against ? checkDraft(db, farm, against) : undefined)
	]);
	if (!plan.ok) return refused('The plan is not valid.', plan.issues);
	if (reference && !reference.ok) {
		return refused(
			`The plan to compare with, "${against!.plan.name}", is not valid.`,
			reference.issues.map((issue) => ({ ...issue, path: `against.${issue.path}` }))
		);
	}
	if (reference) {
		const mismatch = referenceHorizonIssues(plan.document, reference.document);
		if (mismatch.length) return refused('The plans cover different years.', mismatch);
	}
	try {
		const result = evaluatePlan(plan.document, reference?.document);
		if (detail === 'summary') return { ok: true, result: summarisePlan(result) };
		const fieldYears = result.fieldYears.filter(
			(fy) =>
				(field === undefined || fy.fieldId === field) && (year === undefined || fy.year === year)
		);
		return { ok: true, result: { ...result, fieldYears } };
	} catch (error) {
		if (!(error instanceof NonFiniteResultError)) throw error;
		return refused('The plan gives a result that is not a number.', error.issues);
	}
}

export function versionConflictMessage(baseVersion: number, currentVersion: number) {
	return `This plan was saved again (version ${currentVersion}) after you opened version ${baseVersion}: nothing of yours was saved. Open the newest version to see what changed, then make your changes again.`;
}

export function referencePlanDeleteMessage(name: string) {
	return `"${name}" is the farm's reference plan: make another plan the reference before deleting it.`;
}
