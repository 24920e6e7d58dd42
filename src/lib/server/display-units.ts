import {
	quantityUnits,
	saleUnitsPerAcreToKgPerHa,
	saleUnitsToTonnes,
	toMetric,
	type Quantity
} from '$lib/engine/units';
import type { ResultUnit, ResultUnits } from '$lib/components/plan-results/result-units';
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

/**
 * The units a page shows engine results (US customary) in, as plain numbers so the browser never loads
 * the units library: shown = US value × `perUs`; an amount per area divides by the area's.
 */
export function shownScales(system: UnitSystem): ResultUnits & { rate: ResultUnit } {
	const scale = (quantity: Quantity): ResultUnit => ({
		unit: quantityUnits[quantity][system],
		perUs: system === 'metric' ? quantityUnits[quantity].metricPerUs : 1
	});
	return { area: scale('area'), mass: scale('mass'), rate: scale('rate'), volume: scale('volume') };
}
