import type { SaleUnit } from '../../schemas/crops';
import type { FieldYearResult } from '../field-year';
import type { PlanResult } from '../index';

/**
 * Break-even prices and yields of an evaluated plan, holding every quantity as planned (the yields, the
 * inputs, the forage): the textbook break-even, total cost ÷ expected yield for the price and total cost
 * ÷ (price × acres) for the yield (e.g. Iowa State Ag Decision Maker, "Computing a crop break-even
 * price", from memory). A crop's enterprise covers its own costs: inputs, operations with their labour
 * and cash rent; the farm's fixed costs and the herd are covered only by the whole-farm figures.
 * A figure that cannot be worked out (a crop with no yield has no break-even price) is null, with
 * the reason beside it: never Infinity.
 */

export interface CropBreakEven {
	crop: string;
	cropName: string;
	yieldUnit: SaleUnit;
	acres: number;
	/** Sale units per acre, averaged over the crop's acres. */
	yieldPerAcre: number;
	production: number;
	/** The planned price, $ per sale unit (revenue ÷ production; the price set's price). */
	priceUsdPerUnit: number;
	revenueUsd: number;
	costsUsd: number;
	netReturnUsd: number;
	/** The price at which the crop's own net return is zero: its costs ÷ its production. */
	breakEvenPriceUsdPerUnit: number | null;
	breakEvenPriceReason: string | null;
	/** The yield per acre at which the crop's own net return is zero at the planned price. */
	breakEvenYieldPerAcre: number | null;
	breakEvenYieldReason: string | null;
	/** The price of this crop, all else as planned, at which the whole farm's net return is zero. */
	farmBreakEvenPriceUsdPerUnit: number | null;
	farmBreakEvenPriceReason: string | null;
}

export interface FarmBreakEven {
	revenueUsd: number;
	costsUsd: number;
	netReturnUsd: number;
	/**
	 * The uniform fall in every crop price, %, at which the farm's net return is zero (negative: the rise
	 * needed, the farm losing money as planned). With the forage held, a uniform fall in every yield
	 * gives the same figure: crop revenue is price × yield.
	 */
	priceFallPercent: number | null;
	priceFallReason: string | null;
}

export interface BreakEvenYear {
	year: number;
	crops: CropBreakEven[];
	farm: FarmBreakEven;
}

export interface BreakEven {
	years: BreakEvenYear[];
	/** Every year of the horizon pooled: a crop's costs over its production in all years. */
	horizon: { crops: CropBreakEven[]; farm: FarmBreakEven };
}

const noYield = 'No yield: with nothing to sell, no price covers the costs.';
const noPrice = 'No price: at $0 per unit no yield covers the costs.';
const tooLarge = 'Too large to mean anything: the yield or price is close to zero.';
const freeCrop = 'The farm covers its costs even if this crop earns nothing.';
const noRevenue = 'No crop revenue: no fall in prices changes the net return.';

/** `value` when it is a finite number, or null with `reason`. */
function finite(value: number, reason: string): { value: number | null; reason: string | null } {
	return Number.isFinite(value) ? { value, reason: null } : { value: null, reason };
}

interface CropTotals {
	crop: string;
	cropName: string;
	yieldUnit: SaleUnit;
	acres: number;
	production: number;
	revenueUsd: number;
	costsUsd: number;
}

function cropTotals(fieldYears: FieldYearResult[]): CropTotals[] {
	const byCrop = new Map<string, CropTotals>();
	for (const fy of fieldYears) {
		let totals = byCrop.get(fy.crop);
		if (!totals) {
			totals = {
				crop: fy.crop,
				cropName: fy.cropName,
				yieldUnit: fy.yieldUnit,
				acres: 0,
				production: 0,
				revenueUsd: 0,
				costsUsd: 0
			};
			byCrop.set(fy.crop, totals);
		}
		totals.acres += fy.acres;
		totals.production += fy.production;
		totals.revenueUsd += fy.revenueUsd;
		totals.costsUsd += fy.costsUsd;
	}
	return [...byCrop.values()];
}

/** One crop's break-evens, given the whole farm's net return over the same years. */
function cropBreakEven(t: CropTotals, farmNetReturnUsd: number): CropBreakEven {
	const price = t.production > 0 ? t.revenueUsd / t.production : 0;
	const netReturnUsd = t.revenueUsd - t.costsUsd;
	const breakEvenPrice =
		t.production > 0
			? finite(t.costsUsd / t.production, tooLarge)
			: { value: null, reason: noYield };
	const breakEvenYield =
		price > 0 ? finite(t.costsUsd / (price * t.acres), tooLarge) : { value: null, reason: noPrice };
	// The farm's net return moves $production for each $1 of this crop's price.
	let farmPrice: { value: number | null; reason: string | null };
	if (t.production <= 0) farmPrice = { value: null, reason: noYield };
	else {
		farmPrice = finite(price - farmNetReturnUsd / t.production, tooLarge);
		if (farmPrice.value !== null && farmPrice.value <= 0)
			farmPrice = { value: null, reason: freeCrop };
	}
	return {
		...t,
		yieldPerAcre: t.production / t.acres,
		priceUsdPerUnit: price,
		netReturnUsd,
		breakEvenPriceUsdPerUnit: breakEvenPrice.value,
		breakEvenPriceReason: breakEvenPrice.reason,
		breakEvenYieldPerAcre: breakEvenYield.value,
		breakEvenYieldReason: breakEvenYield.reason,
		farmBreakEvenPriceUsdPerUnit: farmPrice.value,
		farmBreakEvenPriceReason: farmPrice.reason
	};
}

/** Every return of the farm is crop revenue: the uniform price fall acts on all of it. */
function farmBreakEven(revenueUsd: number, costsUsd: number): FarmBreakEven {
	const netReturnUsd = revenueUsd - costsUsd;
	// Prices × (1 − f): net return falls by f × crop revenue; zero when f = net return ÷ crop revenue.
	const fall =
		revenueUsd > 0
			? finite((netReturnUsd / revenueUsd) * 100, tooLarge)
			: { value: null, reason: noRevenue };
	return {
		revenueUsd,
		costsUsd,
		netReturnUsd,
		priceFallPercent: fall.value,
		priceFallReason: fall.reason
	};
}

/** Break-even prices and yields of each crop in each year, and of the whole farm, from a plan's result. */
export function breakEven(result: PlanResult): BreakEven {
	const fieldYearsByYear = new Map<number, FieldYearResult[]>(
		result.farmYears.map((fy) => [fy.year, []])
	);
	for (const fy of result.fieldYears) fieldYearsByYear.get(fy.year)?.push(fy);

	const years = result.farmYears.map((farmYear) => {
		const totals = cropTotals(fieldYearsByYear.get(farmYear.year)!);
		return {
			year: farmYear.year,
			crops: totals.map((t) => cropBreakEven(t, farmYear.netReturnUsd)),
			farm: farmBreakEven(farmYear.revenueUsd, farmYear.costsUsd)
		};
	});

	const revenueUsd = result.farmYears.reduce((sum, fy) => sum + fy.revenueUsd, 0);
	const costsUsd = result.farmYears.reduce((sum, fy) => sum + fy.costsUsd, 0);
	return {
		years,
		horizon: {
			crops: cropTotals(result.fieldYears).map((t) => cropBreakEven(t, revenueUsd - costsUsd)),
			farm: farmBreakEven(revenueUsd, costsUsd)
		}
	};
}
