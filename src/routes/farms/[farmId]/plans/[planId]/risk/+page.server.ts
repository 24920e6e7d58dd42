import { error } from '@sveltejs/kit';
import { evaluatePlan, NonFiniteResultError } from '$lib/engine';
import { breakEven, type CropBreakEven } from '$lib/engine/risk/break-even';
import { sensitivity } from '$lib/engine/risk/sensitivity';
import type { CropDefinition } from '$lib/schemas/crops';
import { toFieldErrors } from '$lib/schemas/issues';
import { defaultSensitivitySteps, sensitivityQuerySchema } from '$lib/schemas/risk';
import { requirePlanAccess } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import { displayUnits } from '$lib/server/display-units';
import { storedPlanDocument } from '$lib/server/plans';
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
		const found = breakEven(evaluatePlan(document));
		const units = displayUnits(farm.unitSystem);
		const cropById = new Map(document.crops.map((c) => [c.id, c]));
		const shown = (row: CropBreakEven) => shownCrop(row, cropById.get(row.crop)!, units);
		return {
			farm: { id: farm.id, name: farm.name },
			plan: { id: plan.id, name: plan.name, version: plan.currentVersion },
			areaUnit: units.unit('area'),
			breakEven: {
				years: found.years.map((y) => ({ year: y.year, crops: y.crops.map(shown), farm: y.farm })),
				horizon: { crops: found.horizon.crops.map(shown), farm: found.horizon.farm }
			},
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

/** A crop's break-even figures in the farm's units (per acre and per bushel, or per hectare and tonne). */
function shownCrop(
	row: CropBreakEven,
	crop: CropDefinition,
	units: ReturnType<typeof displayUnits>
) {
	const yieldOf = (value: number | null) =>
		value === null ? null : units.yieldPerArea(value, crop).value;
	const priceOf = (value: number | null) =>
		value === null ? null : units.cropPrice(value, crop).value;
	return {
		crop: row.crop,
		cropName: row.cropName,
		yieldUnit: units.yieldPerArea(1, crop).unit,
		priceUnit: units.cropPrice(1, crop).unit,
		area: units.amount(row.acres, 'area')!,
		yieldPerArea: yieldOf(row.yieldPerAcre)!,
		price: priceOf(row.priceUsdPerUnit)!,
		netReturnUsd: row.netReturnUsd,
		breakEvenPrice: priceOf(row.breakEvenPriceUsdPerUnit),
		breakEvenPriceReason: row.breakEvenPriceReason,
		breakEvenYield: yieldOf(row.breakEvenYieldPerAcre),
		breakEvenYieldReason: row.breakEvenYieldReason,
		farmBreakEvenPrice: priceOf(row.farmBreakEvenPriceUsdPerUnit),
		farmBreakEvenPriceReason: row.farmBreakEvenPriceReason
	};
}
