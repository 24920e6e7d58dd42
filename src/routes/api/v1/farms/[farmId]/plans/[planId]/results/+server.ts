import { error, json } from '@sveltejs/kit';
import { planDraftSchema, resultsQuerySchema } from '$lib/schemas/plans';
import { invalidInput, readJson } from '$lib/server/api';
import { requirePlanAccess } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import { findPlan } from '$lib/server/db/plans';
import { draftResults, findDraft } from '$lib/server/plans';
import type { RequestHandler } from './$types';

/**
 * The engine's results for the plan's newest version, or `?version=`; `?against=<plan id>` adds the
 * partial budget against that plan's newest version; `?detail=summary` (the default) or `full`, which
 * `?field=<field key>` and `?year=` narrow to one field's or one field-year's detail.
 */
export const GET: RequestHandler = async (event) => {
	const { farm, plan } = await requirePlanAccess(
		event,
		event.params.farmId,
		event.params.planId,
		'farm:view'
	);
	const query = resultsQuerySchema.safeParse(Object.fromEntries(event.url.searchParams));
	if (!query.success) return invalidInput(query.error);
	const draft = await findDraft(db, plan, query.data.version);
	if (!draft) error(404, 'Plan version not found.');
	const answer = await draftResults(db, farm, draft, {
		...query.data,
		against: await againstDraft(farm.id, query.data.against)
	});
	return answer.ok ? json(answer.result) : answer.response;
};

/**
 * The results of an unsaved draft of the plan (the body, as `PUT` takes it without `baseVersion`), for
 * the editor's live numbers; nothing is saved. The same `?against=` and `?detail=` as `GET`.
 */
export const POST: RequestHandler = async (event) => {
	const { farm } = await requirePlanAccess(
		event,
		event.params.farmId,
		event.params.planId,
		'farm:view'
	);
	const query = resultsQuerySchema
		.omit({ version: true })
		.safeParse(Object.fromEntries(event.url.searchParams));
	if (!query.success) return invalidInput(query.error);
	const body = await readJson(event.request);
	if (!body.ok) return body.response;
	const parsed = planDraftSchema.safeParse(body.body);
	if (!parsed.success) return invalidInput(parsed.error);
	const answer = await draftResults(db, farm, parsed.data, {
		...query.data,
		against: await againstDraft(farm.id, query.data.against)
	});
	return answer.ok ? json(answer.result) : answer.response;
};

/** The newest version of the plan to compare with; 404 when the farm has no such plan. */
async function againstDraft(farmId: string, planId: string | undefined) {
	if (planId === undefined) return undefined;
	const plan = await findPlan(db, farmId, planId);
	const draft = plan && (await findDraft(db, plan));
	if (!draft) error(404, 'The plan to compare with was not found.');
	return draft;
}
