import { json } from '@sveltejs/kit';
import { requirePlanAccess } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import { makeReferencePlan } from '$lib/server/db/plans';
import type { RequestHandler } from './$types';

/** Makes the plan the farm's reference plan, in place of the one before (owner or editor). */
export const POST: RequestHandler = async (event) => {
	const { user, farm, plan } = await requirePlanAccess(
		event,
		event.params.farmId,
		event.params.planId,
		'plan:edit'
	);
	await makeReferencePlan(db, farm.id, user.id, plan);
	return json({ plan: { id: plan.id, name: plan.name, isReference: true } });
};
