import { z } from 'zod';
import { unitSystemLabels, unitSystems } from '../unit-systems';
import { amount, choice, list, text } from './messages';

/** A farm's own settings: the same shape in the farm form, the API and the plan file's `farm`. */
export const farmSchema = z.strictObject({
	name: text('the farm name', { max: 120, required: true }),
	region: text('the region', { max: 120 }).default(''),
	unitSystem: choice('the unit system', unitSystems)
		.default('us')
		.describe(Object.values(unitSystemLabels).join(' or ')),
	labourHoursAvailableByMonth: list(
		// 31 days × 24 h: more than that is a typing slip.
		'labour hours for each month',
		amount('labour hours in a month', { min: 0, max: 744, unit: 'hours' }),
		{ max: 12 }
	).length(12, { error: 'Give labour hours for all 12 months, January to December.' }),
	// A bound that catches slips such as 650 typed for 6.50, not a judgement of any loan.
	interestRatePercent: amount('the rate', { min: 0, max: 50, unit: '%' }).describe(
		'Annual rate charged on operating costs for the months they are carried.'
	),
	// A bound well above any family farm's overhead that keeps the money columns exact.
	fixedCostsUsdPerYear: amount('fixed costs', { min: 0, max: 100_000_000, usdPer: 'year' })
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
