import {
	quantityUnits,
	saleUnitsPerAcreToKgPerHa,
	saleUnitsToTonnes,
	toMetric,
	type Quantity
} from '$lib/engine/units';
import type { CropDefinition } from '$lib/schemas/crops';
import type { UnitSystem } from '$lib/unit-systems';

/**
 * Stored values are US customary; pages show them in the farm's chosen system. Conversion happens here,
 * on the server, so the browser never loads the units library.
 */
export function displayUnits(system: UnitSystem) {
	const metric = system === 'metric';
	const unit = (quantity: Quantity) => quantityUnits[quantity][system];
	return {
		system,
		unit,
		amount(value: number | null, quantity: Quantity): number | null {
			if (value === null) return null;
			return metric ? toMetric(value, quantity) : value;
		},
		/** A price per US unit ($/ac, $/lb, $/gal) as a price per shown unit ($/ha, $/kg, $/L). */
		pricePer(usd: number | null, quantity: Quantity): number | null {
			if (usd === null) return null;
			return metric ? usd / quantityUnits[quantity].metricPerUs : usd;
		},
		/** Yield per area: per acre in the crop's sale unit (bu/ac, ton/ac…), t/ha in metric (by its weight). */
		yieldPerArea(value: number, crop: CropDefinition): { value: number; unit: string } {
			if (!metric) return { value, unit: `${crop.soldBy}/ac` };
			return { value: saleUnitsPerAcreToKgPerHa(value, crop.lbPerUnit) / 1000, unit: 't/ha' };
		},
		/** A crop price per sale unit (bu, cwt, ton, lb) as a price per shown unit. */
		cropPrice(usd: number, crop: CropDefinition): { value: number; unit: string } {
			if (!metric) return { value: usd, unit: crop.soldBy };
			return { value: usd / saleUnitsToTonnes(1, crop.lbPerUnit), unit: 't' };
		}
	};
}

/** A quantity's shown unit and how many of it one US unit makes: plain numbers a page can scale by. */
export interface ShownScale {
	unit: string;
	perUs: number;
}

/**
 * The scales a page needs to show engine results (US customary) in the farm's units without loading
 * the units library in the browser: shown = US value × `perUs`; a price or amount per area divides.
 */
export function shownScales(
	system: UnitSystem
): Record<'area' | 'mass' | 'rate' | 'volume', ShownScale> {
	const scale = (quantity: Quantity): ShownScale => ({
		unit: quantityUnits[quantity][system],
		perUs: system === 'metric' ? quantityUnits[quantity].metricPerUs : 1
	});
	return { area: scale('area'), mass: scale('mass'), rate: scale('rate'), volume: scale('volume') };
}
