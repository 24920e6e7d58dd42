import { z } from 'zod';
import { amount, id, list } from './messages';

/** A draw count big enough for stable percentiles, small enough to finish in seconds. */
export const drawsRange = { min: 100, max: 50_000 } as const;
export const defaultDraws = 10_000;
/** Seeds are 32-bit whole numbers (the generator's state). */
export const maxSeed = 2_147_483_647;

/**
 * One crop's distribution. CVs stop at 50 %: yields and prices are drawn as normal and held at zero,
 * which above a CV of about 50 % (a 2 % chance of a draw below zero) would no longer be a normal.
 */
export const cropDistributionSchema = z.strictObject({
	crop: id('the crop id'),
	yieldCvPercent: amount('the yield coefficient of variation', { min: 0, max: 50, unit: '%' }),
	priceCvPercent: amount('the price coefficient of variation', { min: 0, max: 50, unit: '%' }),
	priceYieldCorrelation: amount('the price–yield correlation', { min: -1, max: 1 })
});

/** `POST /api/v1/farms/[farmId]/plans/[planId]/risk`: a Monte Carlo of the plan's prices and yields. */
export const monteCarloRequestSchema = z
	.strictObject({
		draws: amount('the number of draws', { ...drawsRange, integer: true }).default(defaultDraws),
		seed: amount('the seed', { min: 0, max: maxSeed, integer: true }).optional(),
		crops: list('crop distributions', cropDistributionSchema, { max: 50 }).default([]),
		sharedWeather: amount('the correlation of two crops’ yields', { min: 0, max: 1 }).optional(),
		sharedMarket: amount('the correlation of two crops’ prices', { min: 0, max: 1 }).optional()
	})
	.superRefine((request, ctx) => {
		const seen = new Set<string>();
		request.crops.forEach((c, i) => {
			if (seen.has(c.crop)) {
				ctx.addIssue({
					code: 'custom',
					path: ['crops', i, 'crop'],
					message: `The crop "${c.crop}" is given twice: give each crop once.`
				});
			}
			seen.add(c.crop);
		});
	});

export type MonteCarloRequest = z.output<typeof monteCarloRequestSchema>;
