import { error, json } from '@sveltejs/kit';
import { planSaveSchema } from '$lib/schemas/plans';
import { conflict, invalidInput, readJson } from '$lib/server/api';
import { requirePlanAccess } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import { deletePlan, savePlanVersion } from '$lib/server/db/plans';
import { invalidIssues } from '$lib/server/practices';
import {
	checkDraft,
	findDraft,
	referencePlanDeleteMessage,
	versionConflictMessage,
	versionContent
} from '$lib/server/plans';
import type { RequestHandler } from './$types';

/** The plan's newest version: `{ plan: { id, name, isReference, version, plan, herd, notes } }`. */
export const GET: RequestHandler = async (event) => {
	const { plan } = await requirePlanAccess(
		event,
		event.params.farmId,
		event.params.planId,
		'farm:view'
	);
	const draft = await findDraft(db, plan);
	if (!draft) error(404, 'Plan version not found.');
	return json({
		plan: {
			id: plan.id,
			name: plan.name,
			isReference: plan.isReference,
			version: plan.currentVersion,
			...draft
		}
	});
};

/**
 * Saves the body as a new version (owner or editor). The body carries `baseVersion`, the version it was
 * edited from: when the plan has been saved since, 409 with `currentVersion` and nothing is saved.
 */
export const PUT: RequestHandler = async (event) => {
	const { user, farm, plan } = await requirePlanAccess(
		event,
		event.params.farmId,
		event.params.planId,
		'plan:edit'
	);
	const body = await readJson(event.request);
	if (!body.ok) return body.response;
	const parsed = planSaveSchema.safeParse(body.body);
	if (!parsed.success) return invalidInput(parsed.error);
	const { baseVersion, changeNote, ...draft } = parsed.data;
	const checked = await checkDraft(db, farm, draft);
	if (!checked.ok) return invalidIssues(checked.issues);
	const outcome = await savePlanVersion(db, {
		farmId: farm.id,
		planId: plan.id,
		userId: user.id,
		baseVersion,
		name: draft.plan.name,
		content: await versionContent(db, farm.id, draft),
		changeNote
	});
	if (!outcome.saved) {
		return conflict(versionConflictMessage(baseVersion, outcome.currentVersion), {
			currentVersion: outcome.currentVersion
		});
	}
	return json({ plan: { id: plan.id, name: draft.plan.name, version: outcome.version } });
};

/** Deletes the plan with every version (owner only); the farm's reference plan is refused (409). */
export const DELETE: RequestHandler = async (event) => {
	const { user, farm, plan } = await requirePlanAccess(
		event,
		event.params.farmId,
		event.params.planId,
		'plan:delete'
	);
	if (!(await deletePlan(db, farm.id, user.id, plan))) {
		return conflict(referencePlanDeleteMessage(plan.name));
	}
	return new Response(null, { status: 204 });
};
