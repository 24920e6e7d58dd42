import type { PriceSet } from '../schemas/plan-file';

/**
 * One year's prices with every by-id price in a `Map`: an id such as "constructor" must find nothing
 * rather than a property every plain object has.
 */
export interface YearPrices {
	year: number;
	nitrogenUsdPerLb: number;
	dieselUsdPerGallon: number;
	labourUsdPerHour: number;
	hayUsdPerBale: number;
	cropUsdPerUnit: Map<string, number>;
	seedPrices: Map<string, { usdPerThousandSeeds?: number; usdPerLb?: number }>;
	customRatesUsdPerAcre: Map<string, number>;
}

export function yearPrices(set: PriceSet): YearPrices {
	return {
		year: set.year,
		nitrogenUsdPerLb: set.nitrogenUsdPerLb,
		dieselUsdPerGallon: set.dieselUsdPerGallon,
		labourUsdPerHour: set.labourUsdPerHour,
		hayUsdPerBale: set.hayUsdPerBale,
		cropUsdPerUnit: new Map(Object.entries(set.cropPricesUsdPerUnit)),
		seedPrices: new Map(Object.entries(set.seedPrices)),
		customRatesUsdPerAcre: new Map(Object.entries(set.customRatesUsdPerAcre))
	};
}
