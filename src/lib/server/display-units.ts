import {
	bushelsPerAcreToKgPerHa,
	bushelsToTonnes,
	kgPerLb,
	poundsPerTon,
	quantityUnits,
	toMetric,
	tonnesPerHaPerTonPerAcre,
	type Quantity
} from '$lib/engine/units';
import { isGrain, type Crop } from '$lib/schemas/plan-file';

export type UnitSystem = 'us' | 'metric';

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
		/** Yield per area: bu/ac or ton/ac in US units, t/ha in metric (bushels by the crop's weight). */
		yieldPerArea(value: number, crop: Crop): { value: number; unit: string } {
			if (!metric) return { value, unit: isGrain(crop) ? 'bu/ac' : 'ton/ac' };
			const tonnesPerHa = isGrain(crop)
				? bushelsPerAcreToKgPerHa(value, crop) / 1000
				: value * tonnesPerHaPerTonPerAcre;
			return { value: tonnesPerHa, unit: 't/ha' };
		},
		/** A crop price per bushel or ton (as sold in US units) as a price per shown unit. */
		cropPrice(usd: number, crop: Crop): { value: number; unit: string } {
			if (!metric) return { value: usd, unit: isGrain(crop) ? 'bu' : 'ton' };
			const tonnesPerUnit = isGrain(crop)
				? bushelsToTonnes(1, crop)
				: (poundsPerTon * kgPerLb) / 1000;
			return { value: usd / tonnesPerUnit, unit: 't' };
		}
	};
}
