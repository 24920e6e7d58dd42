import { z } from 'zod';
import { amount, choice, id, text, yesNo } from './messages';

/**
 * Crops: the one list. A plan file may define its own crops; these eight are built in, so a file that
 * grows only them needs no crop list. Everything the product prints about a crop comes from here.
 */

/** How a crop is sold and priced: by the bushel, the hundredweight, the (short) ton or the pound. */
export const saleUnits = ['bu', 'cwt', 'ton', 'lb'] as const;
export type SaleUnit = (typeof saleUnits)[number];

/** Pounds in one sale unit where the unit itself says it (a bushel's weight differs by crop). */
export const lbPerFixedSaleUnit = new Map<SaleUnit, number>([
	['cwt', 100],
	['ton', 2000],
	['lb', 1]
]);

/** Enterprise names the partial budget uses besides crops: a crop may not take them. */
export const reservedEnterpriseIds = ['herd', 'farm'] as const;

// Ranges catch slips (common practice, no published source): no sale unit outweighs a 2,000 lb ton.
const cropShape = z.strictObject({
	id: id('the crop id').refine(
		(value) => !(reservedEnterpriseIds as readonly string[]).includes(value),
		{ error: `A crop id may not be "herd" or "farm": those name the herd and the whole farm.` }
	),
	name: text('the crop name', { max: 60, required: true }),
	soldBy: choice('how the crop is sold', saleUnits).describe(
		'Sale unit: bu (bushel), cwt (100 lb), ton (2,000 lb, as fed) or lb. Yields and prices are per this unit.'
	),
	lbPerUnit: amount('the pounds in one sale unit', { min: 0.1, max: 2000, unit: 'lb' })
		.optional()
		.describe(
			'Pounds in one bushel (e.g. corn 56); not needed for cwt, ton and lb, which state their weight.'
		),
	residueLeafHuskLbDmPerUnit: amount('the grazable residue per sale unit', {
		min: 0,
		max: 100,
		unit: 'lb dry matter'
	})
		.nullable()
		.default(null)
		.describe(
			'Leaf and husk dry matter cattle can graze, lb per unit of grain harvested; null: no grazable residue.'
		),
	legume: yesNo('legume')
		.default(false)
		.describe('A legume fixes its own N: it takes no N response curve.')
});

/** A crop as a plan file states it; the parsed form always carries `lbPerUnit`. */
export const cropSchema = cropShape.transform((crop, ctx) => {
	const fixed = lbPerFixedSaleUnit.get(crop.soldBy);
	if (fixed === undefined && crop.lbPerUnit === undefined) {
		ctx.addIssue({
			code: 'custom',
			path: ['lbPerUnit'],
			message: `Give the pounds in one bushel of ${crop.name} (e.g. corn 56, soybean 60).`
		});
		return z.NEVER;
	}
	if (fixed !== undefined && crop.lbPerUnit !== undefined && crop.lbPerUnit !== fixed) {
		ctx.addIssue({
			code: 'custom',
			path: ['lbPerUnit'],
			message: `One ${crop.soldBy} is ${fixed} lb; leave lbPerUnit out or give ${fixed}.`
		});
		return z.NEVER;
	}
	return { ...crop, lbPerUnit: fixed ?? crop.lbPerUnit! };
});

export type CropDefinition = z.output<typeof cropSchema>;

/**
 * The built-in crops. Bushel weights: Univ. of Missouri G4020 and FCIC-25010 (legal bushel weights).
 * Corn leaf and husk: UNL (Rasby 2007; CropWatch "Grazing corn residue"), 16 lb DM per bushel.
 */
export const builtInCrops: readonly CropDefinition[] = [
	{
		id: 'corn',
		name: 'Corn',
		soldBy: 'bu',
		lbPerUnit: 56,
		residueLeafHuskLbDmPerUnit: 16,
		legume: false
	},
	{
		id: 'soybean',
		name: 'Soybean',
		soldBy: 'bu',
		lbPerUnit: 60,
		residueLeafHuskLbDmPerUnit: null,
		legume: true
	},
	{
		id: 'wheat',
		name: 'Wheat',
		soldBy: 'bu',
		lbPerUnit: 60,
		residueLeafHuskLbDmPerUnit: null,
		legume: false
	},
	{
		id: 'oats',
		name: 'Oats',
		soldBy: 'bu',
		lbPerUnit: 32,
		residueLeafHuskLbDmPerUnit: null,
		legume: false
	},
	{
		id: 'barley',
		name: 'Barley',
		soldBy: 'bu',
		lbPerUnit: 48,
		residueLeafHuskLbDmPerUnit: null,
		legume: false
	},
	{
		id: 'rye',
		name: 'Rye',
		soldBy: 'bu',
		lbPerUnit: 56,
		residueLeafHuskLbDmPerUnit: null,
		legume: false
	},
	{
		id: 'oat-pea-forage',
		name: 'Oat–pea forage',
		soldBy: 'ton',
		lbPerUnit: 2000,
		residueLeafHuskLbDmPerUnit: null,
		legume: false
	},
	{
		id: 'hay',
		name: 'Hay',
		soldBy: 'ton',
		lbPerUnit: 2000,
		residueLeafHuskLbDmPerUnit: null,
		legume: false
	}
];

/** The built-ins with a file's own crops: a crop the file lists under a built-in id replaces it. */
export function cropsWithBuiltIns(own: readonly CropDefinition[]): CropDefinition[] {
	const byId = new Map(builtInCrops.map((crop) => [crop.id, crop]));
	for (const crop of own) byId.set(crop.id, crop);
	return [...byId.values()];
}
