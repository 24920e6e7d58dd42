import { error } from '@sveltejs/kit';
import { evaluatePlan, NonFiniteResultError } from '$lib/engine';
import { breakEven } from '$lib/engine/risk/break-even';
import { sensitivity } from '$lib/engine/risk/sensitivity';
import { toFieldErrors } from '$lib/schemas/issues';
import { defaultSensitivitySteps, sensitivityQuerySchema } from '$lib/schemas/risk';
import { requirePlanAccess } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import { displayUnits } from '$lib/server/display-units';
import { storedPlanDocument } from '$lib/server/plans';
import { shownBreakEven } from '$lib/server/risk';
import type { PageServerLoad } from './$types';

// Break-even and sensitivity of the plan's newest version, for anyone who may view the farm (a lender
// above all). `?steps=` chooses the sensitivity steps; steps that are not valid show why, and the
// defaults are used meanwhile.
export const load = (async (event) => {
	const { farm, plan } = await requirePlanAccess(
		event,
		event.params.farmId,
		event.params.planId,
		'farm:view'
	);
	const query = sensitivityQuerySchema.safeParse({
		steps: event.url.searchParams.get('steps') ?? undefined
	});
	const steps = query.success ? query.data.steps : defaultSensitivitySteps;
	const stored = await storedPlanDocument(db, farm, plan);
	if (!stored.ok) {
		error(
			422,
			'This plan does not make a valid plan on the farm as it stands: open it to see why.'
		);
	}
	const document = stored.document;
	try {
		return {
			farm: { id: farm.id, name: farm.name },
			plan: { id: plan.id, name: plan.name, version: plan.currentVersion },
			areaUnit: displayUnits(farm.unitSystem).unit('area'),
			breakEven: shownBreakEven(breakEven(evaluatePlan(document)), document),
			sensitivity: sensitivity(document, steps),
			stepsText: event.url.searchParams.get('steps') ?? defaultSensitivitySteps.join(', '),
			stepsError: query.success ? null : Object.values(toFieldErrors(query.error)).join(' ')
		};
	} catch (err) {
		if (err instanceof NonFiniteResultError) {
			error(422, 'This plan gives a result that is not a number: check its prices and yields.');
		}
		throw err;
	}
}) satisfies PageServerLoad;
