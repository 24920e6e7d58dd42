// The distributions a Monte Carlo draws from by default, apart from the engine (no mathjs), so that a
// page can show them in its form before a run.

/**
 * How one crop's yield and price move around the plan's numbers. Yield and price are each drawn as
 * normal around the plan's expected value (the yield the plan computes, the price of the year's price
 * set), with a coefficient of variation (standard deviation ÷ mean), and the two are correlated.
 */
export interface CropDistribution {
	crop: string;
	yieldCvPercent: number;
	priceCvPercent: number;
	/** Correlation of the crop's price with its own yield, −1 to 1 (negative: a short crop sells dear). */
	priceYieldCorrelation: number;
}

export interface CropDistributionDefault extends CropDistribution {
	/** Where the numbers come from, in words a reader can check. */
	source: string;
}

const memory = 'from memory, not re-read: verify against your county before relying on them';
const noSource = 'common practice, no published source';

/**
 * Defaults by built-in crop. Yield CVs are farm-level, year to year (a farm's yields vary more than
 * its county's); price CVs are the spread of the harvest price around the price expected at planting.
 * Farm-level corn and soybean yield CVs of about 15 % and 12 % in the Corn Belt: Univ. of Illinois
 * farmdoc crop-insurance articles (Schnitkey) on farm yield variability, from memory. Price CVs of
 * about 20 % (corn) and 16 % (soybean): the USDA RMA price volatility factors for revenue insurance,
 * which have run about 0.15–0.30, from memory. Price–yield correlation negative (the "natural hedge"
 * of revenue insurance: a short crop raises the price), about −0.3 for corn and −0.2 for soybean at
 * farm level, weaker than at national level: farmdoc and extension risk-management material, from
 * memory. Small grains and forages: common practice, no published source.
 */
const cropDefaults = new Map<string, Omit<CropDistributionDefault, 'crop'>>([
	[
		'corn',
		{
			yieldCvPercent: 15,
			priceCvPercent: 20,
			priceYieldCorrelation: -0.3,
			source: `farmdoc (Univ. of Illinois) farm yield variability; USDA RMA price volatility factors — ${memory}`
		}
	],
	[
		'soybean',
		{
			yieldCvPercent: 12,
			priceCvPercent: 16,
			priceYieldCorrelation: -0.2,
			source: `farmdoc (Univ. of Illinois) farm yield variability; USDA RMA price volatility factors — ${memory}`
		}
	],
	[
		'wheat',
		{
			yieldCvPercent: 18,
			priceCvPercent: 20,
			priceYieldCorrelation: -0.2,
			source: `USDA RMA price volatility factors for wheat — ${memory}; yield CV ${noSource}`
		}
	]
]);

const otherCrop = {
	yieldCvPercent: 20,
	priceCvPercent: 15,
	priceYieldCorrelation: -0.2,
	source: noSource
};

export function defaultCropDistribution(crop: string): CropDistributionDefault {
	return { crop, ...(cropDefaults.get(crop) ?? otherCrop) };
}

/**
 * How the crops move together within a year. Each crop's yield shock is a shared weather shock plus
 * its own (`sharedWeather` is the correlation of two crops' yields); prices likewise share a market
 * shock (`sharedMarket` is the correlation of two crops' prices before each is tied to its own yield).
 * Years are drawn independently of each other.
 */
export interface Comovement {
	sharedWeather: number;
	sharedMarket: number;
}

/**
 * Corn and soybean yields on one farm move together (same weather) and so do their prices (one feed
 * grain market): correlations of about 0.5 and 0.6 — from memory of Corn Belt farm records, not re-read.
 */
export const defaultComovement: Comovement = { sharedWeather: 0.5, sharedMarket: 0.6 };
