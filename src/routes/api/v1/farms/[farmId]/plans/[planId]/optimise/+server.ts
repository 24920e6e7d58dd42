import { json } from '@sveltejs/kit';
import { optimiseOptionsSchema } from '$lib/schemas/optimise';
import { optionsRefused } from '$lib/server/api';
import { requirePlanAccess } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import { currentPlan, optimisePlan } from '$lib/server/optimiser/optimise';
import { planDocumentRequest } from '$lib/server/plans';
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
	const asked = await planDocumentRequest(db, farm, plan, event.request, optimiseOptionsSchema);
	if (!asked.ok) return asked.response;
	const { body: options, document } = asked;
	const optimised = await optimisePlan(document, options);
	if (!optimised.ok) {
		return optionsRefused(optimised.issues);
	}
	return json({ result: optimised.result, current: currentPlan(document) });
};
