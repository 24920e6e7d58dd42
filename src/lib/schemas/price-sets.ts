import { z } from 'zod';
import { id } from './messages';
import { priceSetSchema } from './plan-file';

/**
 * Price sets as the prices pages and `/api/v1/farms/[farmId]/price-sets` take them: the plan file's
 * `priceSetSchema`, so a year's prices typed in the app are prices a plan file (or a CSV row) could hold.
 */

/** A price set as the API takes it; a seed given no price at all is refused rather than dropped. */
export const priceSetBodySchema = priceSetSchema.superRefine((set, ctx) => {
	for (const [seedId, price] of Object.entries(set.seedPrices)) {
		if (price.usdPerThousandSeeds === undefined && price.usdPerLb === undefined) {
			ctx.addIssue({ code: 'custom', path: ['seedPrices', seedId], message: noSeedPrice(seedId) });
		}
	}
});
export type PriceSet = z.output<typeof priceSetSchema>;

const noSeedPrice = (seedId: string) => `Give seed "${seedId}" a price per 1,000 seeds or per lb.`;

/**
 * What the price form shows: an input for each of the farm's crops and custom-hired operations, and a
 * number of seed rows. The browser and the server build the same schema from it.
 */
export interface PriceSetFormLayout {
	cropIds: readonly string[];
	operationIds: readonly string[];
	seedRows: number;
}

/** Input names: crop and operation ids are lower-case letters, digits and hyphens, so `_` parts them. */
export const priceInput = {
	crop: (cropId: string) => `crop_${cropId}`,
	rate: (operationId: string) => `rate_${operationId}`,
	seedId: (row: number) => `seed_${row}_id`,
	seedPerThousand: (row: number) => `seed_${row}_usdPerThousandSeeds`,
	seedPerLb: (row: number) => `seed_${row}_usdPerLb`
};

/** How many seed rows a posted form holds (the page may have shown more than the server would now). */
export function seedRowsIn(form: FormData): number {
	let rows = 0;
	while (form.has(priceInput.seedId(rows))) rows++;
	return rows;
}

const shape = priceSetSchema.shape;
const seedPrice = shape.seedPrices.unwrap().valueType.shape;
const seedIdSchema = id('the seed id');

/** A value the set cannot go without: empty in a new form (not 0), and its own message when left so. */
function required(schema: z.ZodNumber) {
	const message = schema.safeParse(undefined).error!.issues[0].message;
	return schema.nullable().refine((value) => value !== null, { error: message });
}

export type PriceSetForm = Record<string, string | number | null | undefined>;

/** The flat form (a plain POST carries no nested objects): one value for each input. */
export function priceSetFormSchema(layout: PriceSetFormLayout) {
	const values: Record<string, z.ZodType<PriceSetForm[string]>> = {
		year: required(shape.year),
		nitrogenUsdPerLb: required(shape.nitrogenUsdPerLb),
		dieselUsdPerGallon: required(shape.dieselUsdPerGallon),
		labourUsdPerHour: required(shape.labourUsdPerHour),
		hayUsdPerBale: required(shape.hayUsdPerBale)
	};
	for (const cropId of layout.cropIds) {
		values[priceInput.crop(cropId)] = shape.cropPricesUsdPerUnit.valueType.optional();
	}
	for (const operationId of layout.operationIds) {
		values[priceInput.rate(operationId)] = shape.customRatesUsdPerAcre
			.unwrap()
			.valueType.optional();
	}
	for (let row = 0; row < layout.seedRows; row++) {
		values[priceInput.seedId(row)] = z.string().trim().default('');
		values[priceInput.seedPerThousand(row)] = seedPrice.usdPerThousandSeeds;
		values[priceInput.seedPerLb(row)] = seedPrice.usdPerLb;
	}
	return z.object(values).superRefine((form, ctx) => {
		const seen = new Set<string>();
		for (let row = 0; row < layout.seedRows; row++) {
			const seedId = form[priceInput.seedId(row)] as string;
			const priced =
				form[priceInput.seedPerThousand(row)] !== undefined ||
				form[priceInput.seedPerLb(row)] !== undefined;
			const path = [priceInput.seedId(row)];
			if (!seedId) {
				if (priced) ctx.addIssue({ code: 'custom', path, message: 'Enter the seed id.' });
				continue;
			}
			// A seed row without a price is left out: the form lists every seed the practices sow.
			if (!priced) continue;
			const checked = seedIdSchema.safeParse(seedId);
			if (!checked.success) {
				ctx.addIssue({ code: 'custom', path, message: checked.error.issues[0].message });
			} else if (seen.has(seedId)) {
				ctx.addIssue({ code: 'custom', path, message: `Seed "${seedId}" is listed twice.` });
			}
			seen.add(seedId);
		}
	});
}

/** The form's values for a stored set (or a new one, blank); seed rows first, then blank ones. */
export function formValuesOf(
	set: PriceSet | null,
	layout: PriceSetFormLayout,
	seedIds: readonly string[]
): PriceSetForm {
	const values: PriceSetForm = {
		year: set?.year ?? null,
		nitrogenUsdPerLb: set?.nitrogenUsdPerLb ?? null,
		dieselUsdPerGallon: set?.dieselUsdPerGallon ?? null,
		labourUsdPerHour: set?.labourUsdPerHour ?? null,
		hayUsdPerBale: set?.hayUsdPerBale ?? null
	};
	const cropPrices = new Map(Object.entries(set?.cropPricesUsdPerUnit ?? {}));
	const rates = new Map(Object.entries(set?.customRatesUsdPerAcre ?? {}));
	const seedPrices = new Map(Object.entries(set?.seedPrices ?? {}));
	for (const cropId of layout.cropIds) values[priceInput.crop(cropId)] = cropPrices.get(cropId);
	for (const operationId of layout.operationIds) {
		values[priceInput.rate(operationId)] = rates.get(operationId);
	}
	for (let row = 0; row < layout.seedRows; row++) {
		const seedId = seedIds[row] ?? '';
		values[priceInput.seedId(row)] = seedId;
		values[priceInput.seedPerThousand(row)] = seedPrices.get(seedId)?.usdPerThousandSeeds;
		values[priceInput.seedPerLb(row)] = seedPrices.get(seedId)?.usdPerLb;
	}
	return values;
}

/**
 * The form's values as a price set body, and where each of the body's values came from, so an issue
 * the body's own checks raise (`cropPricesUsdPerUnit.corn`) lands beside its input (`crop_corn`).
 */
export function priceSetOfForm(form: PriceSetForm, layout: PriceSetFormLayout) {
	const inputOf = new Map<string, string>();
	const cropPrices = new Map<string, unknown>();
	for (const cropId of layout.cropIds) {
		const price = form[priceInput.crop(cropId)];
		if (price === undefined) continue;
		cropPrices.set(cropId, price);
		inputOf.set(`cropPricesUsdPerUnit.${cropId}`, priceInput.crop(cropId));
	}
	const rates = new Map<string, unknown>();
	for (const operationId of layout.operationIds) {
		const rate = form[priceInput.rate(operationId)];
		if (rate === undefined) continue;
		rates.set(operationId, rate);
		inputOf.set(`customRatesUsdPerAcre.${operationId}`, priceInput.rate(operationId));
	}
	const seedPrices = new Map<string, { usdPerThousandSeeds: unknown; usdPerLb: unknown }>();
	for (let row = 0; row < layout.seedRows; row++) {
		const seedId = form[priceInput.seedId(row)];
		const usdPerThousandSeeds = form[priceInput.seedPerThousand(row)];
		const usdPerLb = form[priceInput.seedPerLb(row)];
		if (typeof seedId !== 'string' || !seedId) continue;
		if (usdPerThousandSeeds === undefined && usdPerLb === undefined) continue;
		seedPrices.set(seedId, { usdPerThousandSeeds, usdPerLb });
		inputOf.set(`seedPrices.${seedId}`, priceInput.seedId(row));
		inputOf.set(`seedPrices.${seedId}.usdPerThousandSeeds`, priceInput.seedPerThousand(row));
		inputOf.set(`seedPrices.${seedId}.usdPerLb`, priceInput.seedPerLb(row));
	}
	const body = {
		year: form.year,
		// Object.fromEntries makes own keys whatever they are: a typed id never reaches a prototype.
		cropPricesUsdPerUnit: Object.fromEntries(cropPrices),
		nitrogenUsdPerLb: form.nitrogenUsdPerLb,
		dieselUsdPerGallon: form.dieselUsdPerGallon,
		labourUsdPerHour: form.labourUsdPerHour,
		hayUsdPerBale: form.hayUsdPerBale,
		seedPrices: Object.fromEntries(seedPrices),
		customRatesUsdPerAcre: Object.fromEntries(rates)
	};
	return { body, inputOf: (path: string) => inputOf.get(path) ?? path };
}
