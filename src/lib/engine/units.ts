import { create, createUnitDependencies, unitDependencies } from 'mathjs';

/**
 * The one place for unit conversion. The engine works in US customary units; metric is for display
 * and entry at the edges. Factors come from mathjs units once, at load, so the engine's hot paths only
 * multiply.
 */

// Only the unit functions: the full bundle costs far more to load than these few fixed factors need.
const math = create({ unitDependencies, createUnitDependencies });
// mathjs's built-in `acre` is rounded to 4046.86 m²; the acre is exactly 43,560 ft² (NDSU metric card).
math.createUnit('acreExact', '43560 ft^2');

function factor(from: string, to: string): number {
	return math.unit(1, from).toNumber(to);
}

export const squareFeetPerAcre = factor('acreExact', 'ft^2');
export const feetPerMile = factor('mi', 'ft');
export const inchesPerFoot = factor('ft', 'inch');
export const poundsPerTon = factor('ton', 'lb');
export const hectaresPerAcre = factor('acreExact', 'hectare');
export const kgPerLb = factor('lb', 'kg');
export const litresPerGallon = factor('gal', 'L');
export const kwPerHp = factor('hp', 'kW');
export const kmhPerMph = factor('mi/h', 'km/h');
export const metresPerFoot = factor('ft', 'm');
export const kgPerHaPerLbPerAcre = factor('lb/acreExact', 'kg/hectare');
export const litresPerHaPerGallonPerAcre = factor('gal/acreExact', 'L/hectare');
export const tonnesPerHaPerTonPerAcre = factor('ton/acreExact', 'tonne/hectare');

export { daysPerAnimalUnitMonth, lbLiveWeightPerAnimalUnit } from './animal-units';

/**
 * Sale units by weight: a yield or price per sale unit in metric tonnes, given the pounds in one unit
 * (a bushel's weight is the crop's own: see `schemas/crops.ts`).
 */
export function saleUnitsToTonnes(units: number, lbPerUnit: number): number {
	return (units * lbPerUnit * kgPerLb) / 1000;
}

export function tonnesToSaleUnits(tonnes: number, lbPerUnit: number): number {
	return (tonnes * 1000) / (lbPerUnit * kgPerLb);
}

/** Sale units per acre (bu/ac, cwt/ac, ton/ac, lb/ac) as kg/ha. */
export function saleUnitsPerAcreToKgPerHa(unitsPerAcre: number, lbPerUnit: number): number {
	return unitsPerAcre * lbPerUnit * kgPerHaPerLbPerAcre;
}

export function kgPerHaToSaleUnitsPerAcre(kgPerHa: number, lbPerUnit: number): number {
	return kgPerHa / (lbPerUnit * kgPerHaPerLbPerAcre);
}

/** Quantities the app shows in either system, with their US and metric units. */
export const quantityUnits = {
	area: { us: 'ac', metric: 'ha', metricPerUs: hectaresPerAcre },
	mass: { us: 'lb', metric: 'kg', metricPerUs: kgPerLb },
	rate: { us: 'lb/ac', metric: 'kg/ha', metricPerUs: kgPerHaPerLbPerAcre },
	volume: { us: 'gal', metric: 'L', metricPerUs: litresPerGallon },
	volumeRate: { us: 'gal/ac', metric: 'L/ha', metricPerUs: litresPerHaPerGallonPerAcre },
	tonRate: { us: 'ton/ac', metric: 't/ha', metricPerUs: tonnesPerHaPerTonPerAcre },
	power: { us: 'hp', metric: 'kW', metricPerUs: kwPerHp },
	speed: { us: 'mph', metric: 'km/h', metricPerUs: kmhPerMph },
	length: { us: 'ft', metric: 'm', metricPerUs: metresPerFoot }
} as const;

export type Quantity = keyof typeof quantityUnits;

export function toMetric(value: number, quantity: Quantity): number {
	return value * quantityUnits[quantity].metricPerUs;
}

export function toUs(value: number, quantity: Quantity): number {
	return value / quantityUnits[quantity].metricPerUs;
}
