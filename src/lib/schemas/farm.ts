import { z } from 'zod';

const MONTHS = 12;

export const farmSettingsSchema = z.object({
	name: z
		.string({ error: 'Enter the farm name.' })
		.trim()
		.min(1, { error: 'Enter the farm name.' })
		.max(120, { error: 'Use at most 120 characters.' }),
	region: z.string().trim().max(120, { error: 'Use at most 120 characters.' }).default(''),
	unitSystem: z.enum(['us', 'metric'], { error: 'Choose US customary or metric units.' }),
	labourHoursByMonth: z
		.array(
			z.coerce
				.number({ error: 'Enter hours as a number.' })
				.min(0, { error: 'Hours cannot be negative.' })
				.max(744, { error: 'A month has at most 744 hours.' }),
			{ error: 'Give labour hours for each month.' }
		)
		.length(MONTHS, { error: 'Give labour hours for all 12 months.' }),
	discountRatePct: z.coerce
		.number({ error: 'Enter the rate as a number.' })
		.min(0, { error: 'The rate cannot be negative.' })
		.max(50, { error: 'Enter a rate of at most 50 %.' })
});

export type FarmSettings = z.output<typeof farmSettingsSchema>;

/** Reads the farm form's fields (one `labourHours` input per month) into the schema's shape. */
export function farmSettingsFromForm(form: FormData): unknown {
	return {
		name: form.get('name') ?? undefined,
		region: form.get('region') ?? undefined,
		unitSystem: form.get('unitSystem') ?? undefined,
		labourHoursByMonth: form.getAll('labourHours').map((v) => (v === '' ? undefined : v)),
		discountRatePct: form.get('discountRatePct') || undefined
	};
}
