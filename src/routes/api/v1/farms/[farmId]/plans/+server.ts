import { json } from '@sveltejs/kit';
import { planCreateSchema } from '$lib/schemas/plans';
import { invalidInput, readJson } from '$lib/server/api';
import { requireFarmAccess } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import { createPlan, listPlansByFarm } from '$lib/server/db/plans';
import { invalidIssues } from '$lib/server/practices';
import { checkDraft, versionContent } from '$lib/server/plans';
import type { RequestHandler } from './$types';

/** The farm's plans by name: `{ plans: [{ id, name, isReference, currentVersion, startYear, years }] }`. */
export const GET: RequestHandler = async (event) => {
	const { farm } = await requireFarmAccess(event, event.params.farmId, 'farm:view');
	return json({ plans: await listPlansByFarm(db, farm.id) });
};

/** Adds a plan as version 1 from a draft (owner or editor): 201 `{ plan: { id, name, version } }`. */
export const POST: RequestHandler = async (event) => {
	const { user, farm } = await requireFarmAccess(event, event.params.farmId, 'plan:edit');
	const body = await readJson(event.request);
	if (!body.ok) return body.response;
	const parsed = planCreateSchema.safeParse(body.body);
	if (!parsed.success) return invalidInput(parsed.error);
	const checked = await checkDraft(db, farm, parsed.data);
	if (!checked.ok) return invalidIssues(checked.issues);
	const { changeNote, ...draft } = parsed.data;
	const saved = await createPlan(db, {
		farmId: farm.id,
		userId: user.id,
		name: draft.plan.name,
		content: await versionContent(db, farm.id, draft),
		changeNote
	});
	return json(
		{ plan: { id: saved.planId, name: draft.plan.name, version: saved.version } },
		{ status: 201 }
	);
};
