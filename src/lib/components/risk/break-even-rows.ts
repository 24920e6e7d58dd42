// The break-even figures as the risk page and the report show them: in the farm's units (per acre and
// per bushel, or per hectare and tonne), shaped on the server by `shownBreakEven`.
import type { FarmBreakEven } from '$lib/engine/risk/break-even';

export interface ShownCropBreakEven {
	crop: string;
	cropName: string;
	yieldUnit: string;
	priceUnit: string;
	area: number;
	yieldPerArea: number;
	price: number;
	netReturnUsd: number;
	breakEvenPrice: number | null;
	breakEvenPriceReason: string | null;
	breakEvenYield: number | null;
	breakEvenYieldReason: string | null;
	farmBreakEvenPrice: number | null;
	farmBreakEvenPriceReason: string | null;
}

export interface ShownBreakEven {
	years: { year: number; crops: ShownCropBreakEven[]; farm: FarmBreakEven }[];
	horizon: { crops: ShownCropBreakEven[]; farm: FarmBreakEven };
}
