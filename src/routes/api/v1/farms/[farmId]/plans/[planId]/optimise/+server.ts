import { json } from '@sveltejs/kit';
import { optimiseOptionsSchema } from '$lib/schemas/optimise';
import { invalidInput, readJson } from '$lib/server/api';
import { requirePlanAccess } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import { currentPlan, optimisePlan } from '$lib/server/optimiser/optimise';
import { storedPlanDocument } from '$lib/server/plans';
import type { RequestHandler } from './$types';

/**
 * The best rotation mix for the farm under the plan's newest version (its practices, rotations, prices
 * and herd): `{ result, current }`, `current` being the plan as it stands. The body is the optimiser's
 * options; bad options: 422 naming each. Anyone who may view the farm may ask; nothing is saved.
 */
export const POST: RequestHandler = async (event) => {
	const { farm, plan } = await requirePlanAccess(
		event,
		event.params.farmId,
		event.params.planId,
		'farm:view'
	);
	const body = await readJson(event.request);
	if (!body.ok) return body.response;
	const options = optimiseOptionsSchema.safeParse(body.body);
	if (!options.success) return invalidInput(options.error);
	const stored = await storedPlanDocument(db, farm, plan);
	if (!stored.ok) return stored.response;
	const optimised = await optimisePlan(stored.document, options.data);
	if (!optimised.ok) {
		return json(
			{ message: 'The options do not fit the plan.', issues: optimised.issues },
			{ status: 422 }
		);
	}
	return json({ result: optimised.result, current: currentPlan(stored.document) });
};
