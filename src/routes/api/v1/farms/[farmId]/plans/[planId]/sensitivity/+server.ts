import { json } from '@sveltejs/kit';
import { sensitivityQuerySchema } from '$lib/schemas/risk';
import { invalidInput } from '$lib/server/api';
import { requirePlanAccess } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import { planHeading, planSensitivity, withPlan } from '$lib/server/risk';
import type { RequestHandler } from './$types';

/**
 * One-at-a-time sensitivity of the plan's average net return to each crop's price and yield, the N
 * price, diesel, hay price and labour rate, moved by `?steps=` (% , comma-separated; left out: −20, −10,
 * 10, 20). Anyone who may view the farm.
 */
export const GET: RequestHandler = async (event) => {
	const { farm, plan } = await requirePlanAccess(
		event,
		event.params.farmId,
		event.params.planId,
		'farm:view'
	);
	const query = sensitivityQuerySchema.safeParse(Object.fromEntries(event.url.searchParams));
	if (!query.success) return invalidInput(query.error);
	const answer = await withPlan(db, farm, plan, (document) => ({
		plan: planHeading(plan, document),
		sensitivity: planSensitivity(document, query.data.steps)
	}));
	return answer.ok ? json(answer.value) : answer.response;
};
