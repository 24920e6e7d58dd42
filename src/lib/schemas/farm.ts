import { z } from 'zod';

const number = (label: string) => z.number({ error: `Enter ${label} as a number.` });

/** A farm's own settings: the same shape in the farm form, the API and the plan file's `farm`. */
export const farmSchema = z.strictObject({
	name: z
		.string({ error: 'Enter the farm name.' })
		.trim()
		.min(1, { error: 'Enter the farm name.' })
		.max(120, { error: 'Use at most 120 characters.' }),
	region: z.string().trim().max(120, { error: 'Use at most 120 characters.' }).default(''),
	unitSystem: z
		.enum(['us', 'metric'], { error: 'Choose US customary or metric units.' })
		.default('us'),
	labourHoursAvailableByMonth: z
		.array(
			number('hours')
				.min(0, { error: 'Hours cannot be negative.' })
				// 31 days × 24 h: more than that is a typing slip.
				.max(744, { error: 'A month has at most 744 hours.' }),
			{ error: 'Give labour hours for each month, January to December.' }
		)
		.length(12, { error: 'Give labour hours for all 12 months, January to December.' }),
	interestRatePercent: number('the rate')
		.min(0, { error: 'The rate cannot be negative.' })
		// A bound that catches slips such as 650 typed for 6.50, not a judgement of any loan.
		.max(50, { error: 'Enter a rate of at most 50 %.' })
		.describe('Annual rate charged on operating costs for the months they are carried.'),
	fixedCostsUsdPerYear: number('fixed costs')
		.min(0, { error: 'Fixed costs cannot be negative.' })
		.default(0)
		.describe(
			'Land, machinery and building ownership, insurance, overhead: costs the plan does not change.'
		)
});

export type FarmSettings = z.output<typeof farmSchema>;

/** A form's text as a number for the schema; text that is not a number stays text, so the schema names it. */
function formNumber(value: FormDataEntryValue | null): unknown {
	if (value === null) return undefined;
	const text = String(value).trim();
	if (text === '') return undefined;
	const parsed = Number(text.replace(/,/g, ''));
	return Number.isFinite(parsed) ? parsed : text;
}

/** Reads the farm form (one `labourHours` input per month) into the schema's shape. */
export function farmSettingsFromForm(form: FormData): Record<string, unknown> {
	return {
		name: form.get('name') ?? undefined,
		region: form.get('region') ?? undefined,
		unitSystem: form.get('unitSystem') ?? undefined,
		labourHoursAvailableByMonth: form.getAll('labourHours').map(formNumber),
		interestRatePercent: formNumber(form.get('interestRatePercent')),
		fixedCostsUsdPerYear: formNumber(form.get('fixedCostsUsdPerYear'))
	};
}
