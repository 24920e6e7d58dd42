/**
 * The one place for unit conversion. The engine works in US customary units; metric is for display
 * and entry at the edges. Every factor follows from the exact definitions below, so the engine's hot
 * paths only multiply; the tests check each against mathjs's units. (Loading mathjs to work them out
 * at start cost each process about a second here: its package builds every one of its functions when
 * it is imported.)
 */

// Exact by definition (NIST Handbook 44, Appendix C; the international yard and pound of 1959).
export const metresPerFoot = 0.3048;
export const kgPerLb = 0.45359237;
export const feetPerMile = 5280;
export const inchesPerFoot = 12;
/** The US acre, 43,560 ft² (NDSU metric card). */
export const squareFeetPerAcre = 43560;
/** The short ton. */
export const poundsPerTon = 2000;
/** The US liquid gallon, 231 in³ = 3.785411784 L. */
export const litresPerGallon = 3.785411784;
/** Mechanical horsepower: 550 ft·lbf/s, with standard gravity 9.80665 m/s² (exact, CGPM 1901). */
export const kwPerHp = (550 * metresPerFoot * kgPerLb * 9.80665) / 1000;

const squareMetresPerHectare = 10_000;
export const hectaresPerAcre = (squareFeetPerAcre * metresPerFoot ** 2) / squareMetresPerHectare;
export const kmhPerMph = (feetPerMile * metresPerFoot) / 1000;
export const kgPerHaPerLbPerAcre = kgPerLb / hectaresPerAcre;
export const litresPerHaPerGallonPerAcre = litresPerGallon / hectaresPerAcre;
export const tonnesPerHaPerTonPerAcre = (poundsPerTon * kgPerLb) / 1000 / hectaresPerAcre;

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
