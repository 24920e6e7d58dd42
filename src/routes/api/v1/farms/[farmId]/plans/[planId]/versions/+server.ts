import { error, json } from '@sveltejs/kit';
import { planRestoreSchema } from '$lib/schemas/plans';
import { conflict, invalidInput, readJson } from '$lib/server/api';
import { requirePlanAccess } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import { findVersionContent, listPlanVersions, savePlanVersion } from '$lib/server/db/plans';
import { invalidIssues } from '$lib/server/practices';
import { checkVersion, versionConflictMessage } from '$lib/server/plans';
import type { RequestHandler } from './$types';

/** Every version, newest first: `{ versions: [{ version, savedAt, savedBy, changeNote, … }] }`. */
export const GET: RequestHandler = async (event) => {
	const { plan } = await requirePlanAccess(
		event,
		event.params.farmId,
		event.params.planId,
		'farm:view'
	);
	return json({ versions: await listPlanVersions(db, plan.id) });
};

/**
 * Restores `version` by saving it again as the newest (owner or editor); like a save it carries
 * `baseVersion` and a stale one gets 409; a version that no longer makes a valid plan with the farm's
 * data as it is now gets 422. 201 `{ plan: { id, name, version } }`.
 */
export const POST: RequestHandler = async (event) => {
	const { user, farm, plan } = await requirePlanAccess(
		event,
		event.params.farmId,
		event.params.planId,
		'plan:edit'
	);
	const body = await readJson(event.request);
	if (!body.ok) return body.response;
	const parsed = planRestoreSchema.safeParse(body.body);
	if (!parsed.success) return invalidInput(parsed.error);
	const { version, baseVersion } = parsed.data;
	const content = await findVersionContent(db, plan.id, version);
	if (!content) error(404, 'Plan version not found.');
	const checked = await checkVersion(db, farm, plan, version);
	if (!checked?.ok) return invalidIssues(checked?.issues ?? []);
	const outcome = await savePlanVersion(db, {
		farmId: farm.id,
		planId: plan.id,
		userId: user.id,
		baseVersion,
		name: plan.name,
		content,
		changeNote: `Restored version ${version}`,
		restoredFromVersion: version
	});
	if (!outcome.saved) {
		return conflict(versionConflictMessage(baseVersion, outcome.currentVersion), {
			currentVersion: outcome.currentVersion
		});
	}
	return json(
		{ plan: { id: plan.id, name: plan.name, version: outcome.version } },
		{ status: 201 }
	);
};
