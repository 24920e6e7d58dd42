import { json } from '@sveltejs/kit';
import { planCopySchema } from '$lib/schemas/plans';
import { invalidInput, readJson } from '$lib/server/api';
import { requirePlanAccess } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import { copyPlan } from '$lib/server/db/plans';
import { invalidIssues } from '$lib/server/practices';
import { checkVersion } from '$lib/server/plans';
import type { RequestHandler } from './$types';

/**
 * A copy of the plan's newest version as a new plan named `name` (owner or editor): 201 `{ plan }`; 422
 * when that version no longer makes a valid plan with the farm's data as it is now.
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
	const parsed = planCopySchema.safeParse(body.body);
	if (!parsed.success) return invalidInput(parsed.error);
	const checked = await checkVersion(db, farm, plan, plan.currentVersion);
	if (!checked?.ok) return invalidIssues(checked?.issues ?? []);
	const saved = await copyPlan(db, {
		farmId: farm.id,
		userId: user.id,
		plan,
		name: parsed.data.name
	});
	return json(
		{ plan: { id: saved.planId, name: parsed.data.name, version: saved.version } },
		{ status: 201 }
	);
};
