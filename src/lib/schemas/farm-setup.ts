import { z } from 'zod';
import { cropSchema } from './crops';
import { amount, id, type Range } from './messages';
import { cashRentMessage, fieldSchema } from './plan-file';

/**
 * Fields and crops as the farm set-up pages and `/api/v1/farms/[farmId]/fields|crops` take them: the plan
 * file's own schemas, so a field or crop typed in the app is one a plan file could hold.
 *
 * A field's `id` in the API is the database's (it appears in URLs); the plan file's field id is its
 * `key`, made from the name when not given. A crop has no such split: built-in crops have no row of their
 * own and practices name crops by plan-file id, so a crop's `id` is the plan file's everywhere.
 */

/** A field as the API takes it (POST; PATCH merges its body over the stored field first). */
export const fieldBodySchema = fieldSchema
	.omit({ id: true })
	.extend({ key: id('the field key').optional() })
	.superRefine((field, ctx) => {
		const message = cashRentMessage(field);
		if (message) ctx.addIssue({ code: 'custom', path: ['cashRentUsdPerAcre'], message });
	});
export type FieldBody = z.output<typeof fieldBodySchema>;

/** The ranges of the values the fields form shows in the farm's own unit (acres or hectares). */
export interface FieldFormRanges {
	area: Range & { unit: string };
	cashRent: Range & { usdPer: string };
}

/** What the fields form shows, with the area and the rent per area in the farm's own unit. */
export function fieldFormSchema(ranges: FieldFormRanges) {
	return fieldSchema
		.pick({ name: true, productivityIndex: true, priorCrop: true, tenure: true, notes: true })
		.extend({
			area: amount('field area', ranges.area),
			cashRent: amount('the cash rent', ranges.cashRent).default(0)
		})
		.superRefine((field, ctx) => {
			const message = cashRentMessage({ ...field, cashRentUsdPerAcre: field.cashRent });
			if (message) ctx.addIssue({ code: 'custom', path: ['cashRent'], message });
		});
}
export type FieldForm = z.output<ReturnType<typeof fieldFormSchema>>;

/**
 * The crop form: a crop less its id (made from the name). The crop schema's own check of the weight (a
 * bushel needs it; cwt, ton and lb state theirs) runs here too, so the browser shows it as the server would.
 */
export const cropFormSchema = cropSchema.in.omit({ id: true }).superRefine((crop, ctx) => {
	const checked = cropSchema.safeParse({ ...crop, id: 'crop' });
	if (checked.success) return;
	for (const issue of checked.error.issues) {
		if (issue.path[0] === 'lbPerUnit') ctx.addIssue({ ...issue, code: 'custom' });
	}
});
export type CropForm = z.output<typeof cropFormSchema>;

/** A crop as the API takes it: a plan file's crop, its `id` made from the name when not given. */
export const cropBodySchema = cropSchema.in.extend({ id: cropSchema.in.shape.id.optional() });

const maxKeyLength = 56; // room for a "-99" suffix inside the 60 characters an id may have

/**
 * A plan-file id from a name ("North Flat #2" → "north-flat-2"), unique among `taken`: a suffix -2, -3…
 * when the plain one is taken; `fallback` when the name has no letters or digits.
 */
export function keyFromName(name: string, taken: ReadonlySet<string>, fallback: string): string {
	const plain =
		name
			.normalize('NFKD')
			.replace(/[\u0300-\u036f]/g, '')
			.toLowerCase()
			.replace(/[^a-z0-9]+/g, '-')
			.replace(/^-+|-+$/g, '')
			.slice(0, maxKeyLength)
			.replace(/-+$/, '') || fallback;
	if (!taken.has(plain)) return plain;
	for (let n = 2; ; n++) {
		const candidate = `${plain}-${n}`;
		if (!taken.has(candidate)) return candidate;
	}
}

/** True for a JSON object (the only body PATCH can merge over a stored row). */
export function isJsonObject(value: unknown): value is Record<string, unknown> {
	return typeof value === 'object' && value !== null && !Array.isArray(value);
}
