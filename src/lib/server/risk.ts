// What the risk and cash-flow routes and pages share: a plan's newest version evaluated, then its
// break-even, sensitivity or cash flow, or the 422 saying why not.
import { json } from '@sveltejs/kit';
import { evaluatePlan, NonFiniteResultError, type PlanResult } from '$lib/engine';
import type { ShownBreakEven } from '$lib/components/risk/break-even-rows';
import { breakEven, type BreakEven, type CropBreakEven } from '$lib/engine/risk/break-even';
import { cashFlow } from '$lib/engine/risk/cash-flow';
import { sensitivity } from '$lib/engine/risk/sensitivity';
import type { CropDefinition } from '$lib/schemas/crops';
import type { PlanDocument } from '$lib/schemas/plan-file';
import type { CashFlowSettings } from '$lib/schemas/risk';
import type { Db, Tx } from '$lib/server/db/client';
import type { PlanRow } from '$lib/server/db/plans';
import type { farms } from '$lib/server/db/schema';
import { displayUnits } from '$lib/server/display-units';
import { storedPlanDocument } from '$lib/server/plans';

type Farm = typeof farms.$inferSelect;
type Answer<T> = { ok: true; value: T } | { ok: false; response: Response };

/** The plan as answers name it. */
export function planHeading(plan: PlanRow, document: PlanDocument) {
	return {
		id: plan.id,
		name: plan.name,
		version: plan.currentVersion,
		startYear: document.plan.horizon.startYear,
		years: document.plan.horizon.years
	};
}

/** Runs `work` on the plan's newest version; a plan that is not valid or not finite: 422. */
export async function withPlan<T>(
	db: Db | Tx,
	farm: Farm,
	plan: PlanRow,
	work: (document: PlanDocument) => T
): Promise<Answer<T>> {
	const stored = await storedPlanDocument(db, farm, plan);
	if (!stored.ok) return stored;
	try {
		return { ok: true, value: work(stored.document) };
	} catch (error) {
		if (!(error instanceof NonFiniteResultError)) throw error;
		return {
			ok: false,
			response: json(
				{ message: 'The plan gives a result that is not a number.', issues: error.issues },
				{ status: 422 }
			)
		};
	}
}

export function planBreakEven(document: PlanDocument) {
	return breakEven(evaluatePlan(document));
}

/** Break-even figures in the farm's units, as the risk page and the report show them. */
export function shownBreakEven(found: BreakEven, document: PlanDocument): ShownBreakEven {
	const units = displayUnits(document.farm.unitSystem);
	const cropById = new Map(document.crops.map((c) => [c.id, c]));
	const shown = (row: CropBreakEven) => shownCrop(row, cropById.get(row.crop)!, units);
	return {
		years: found.years.map((y) => ({ year: y.year, crops: y.crops.map(shown), farm: y.farm })),
		horizon: { crops: found.horizon.crops.map(shown), farm: found.horizon.farm }
	};
}

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

export function planSensitivity(document: PlanDocument, stepsPercent: number[]) {
	return sensitivity(document, stepsPercent);
}

/** The plan's cash flow under the farm's settings, at the farm's interest rate. */
export function planCashFlow(
	document: PlanDocument,
	settings: CashFlowSettings,
	result: PlanResult = evaluatePlan(document)
) {
	return cashFlow(result, {
		startingCashUsd: settings.startingCashUsd,
		minimumBalanceUsd: settings.minimumBalanceUsd,
		interestRatePercent: document.farm.interestRatePercent,
		saleMonthByCrop: new Map(settings.saleMonths.map((s) => [s.crop, s.month])),
		feedingSeasonStartMonth: document.herd?.feedingSeasonStartMonth ?? null
	});
}

/** A `?year=` outside the plan's years: 422 naming the years it has. */
export function yearOutsidePlan(year: number, document: PlanDocument) {
	const { startYear, years } = document.plan.horizon;
	const message = `${year} is not a year of this plan: it runs ${startYear}–${startYear + years - 1}.`;
	return json(
		{ message: 'The input is not valid.', issues: [{ path: 'year', message }] },
		{
			status: 422
		}
	);
}
