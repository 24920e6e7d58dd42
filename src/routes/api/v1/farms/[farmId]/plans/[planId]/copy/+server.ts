import { json } from '@sveltejs/kit';
import { planCopySchema } from '$lib/schemas/plans';
import { invalidInput, readJson } from '$lib/server/api';
import { requirePlanAccess } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import { copyPlan } from '$lib/server/db/plans';
import type { RequestHandler } from './$types';

/** A copy of the plan's newest version as a new plan named `name` (owner or editor): 201 `{ plan }`. */
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
