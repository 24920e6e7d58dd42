import { json } from '@sveltejs/kit';
import { requirePlanAccess } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import { planBreakEven, planHeading, withPlan } from '$lib/server/risk';
import type { RequestHandler } from './$types';

/**
 * Break-even prices and yields of each crop in each year of the plan's newest version, and of the whole
 * farm (the uniform fall in crop prices at which its net return is zero). Anyone who may view the farm.
 */
export const GET: RequestHandler = async (event) => {
	const { farm, plan } = await requirePlanAccess(
		event,
		event.params.farmId,
		event.params.planId,
		'farm:view'
	);
	const answer = await withPlan(db, farm, plan, (document) => ({
		plan: planHeading(plan, document),
		breakEven: planBreakEven(document)
	}));
	return answer.ok ? json(answer.value) : answer.response;
};
