import { json } from '@sveltejs/kit';
import { cashFlowQuerySchema } from '$lib/schemas/risk';
import { invalidInput } from '$lib/server/api';
import { requirePlanAccess } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import { findCashFlowSettings } from '$lib/server/db/cash-flow';
import { planCashFlow, planHeading, withPlan, yearOutsidePlan } from '$lib/server/risk';
import type { RequestHandler } from './$types';

/**
 * The monthly cash flow of the plan's newest version under the farm's cash-flow settings, with the
 * operating loan and its peak; `?year=` answers one plan year (the peak loan stays the horizon's).
 * Anyone who may view the farm.
 */
export const GET: RequestHandler = async (event) => {
	const { farm, plan } = await requirePlanAccess(
		event,
		event.params.farmId,
		event.params.planId,
		'farm:view'
	);
	const query = cashFlowQuerySchema.safeParse(Object.fromEntries(event.url.searchParams));
	if (!query.success) return invalidInput(query.error);
	const settings = await findCashFlowSettings(db, farm.id);
	const answer = await withPlan(db, farm, plan, (document) => {
		const { year } = query.data;
		const { startYear, years } = document.plan.horizon;
		if (year !== undefined && (year < startYear || year >= startYear + years)) {
			return yearOutsidePlan(year, document);
		}
		const flow = planCashFlow(document, settings);
		return {
			plan: planHeading(plan, document),
			settings,
			cashFlow:
				year === undefined ? flow : { ...flow, years: flow.years.filter((y) => y.year === year) }
		};
	});
	if (!answer.ok) return answer.response;
	return answer.value instanceof Response ? answer.value : json(answer.value);
};
