import { z } from 'zod';
import { amount, id, list, month } from './messages';
import { yearSchema } from './plan-file';

/**
 * The risk and cash-flow inputs: sensitivity steps, and the farm's cash-flow settings (the starting cash,
 * the lowest balance the farm keeps and the month each crop is sold). Bounds are plausible limits that
 * catch slips, common practice, no published source.
 */

/**
 * A one-at-a-time step, % of the planned value. −90…+100 % is the span a plan's own yield adjustment
 * takes, so a moved yield is one the plan file could state.
 */
export const sensitivityStepSchema = amount('a sensitivity step', {
	min: -90,
	max: 100,
	unit: '%'
}).refine((step) => step !== 0, {
	error: 'A sensitivity step of 0 % moves nothing: leave it out.'
});

export const defaultSensitivitySteps = [-20, -10, 10, 20];

export const sensitivityStepsSchema = list('sensitivity steps', sensitivityStepSchema, {
	min: 1,
	max: 8
}).refine((steps) => new Set(steps).size === steps.length, {
	error: 'Give each sensitivity step once.'
});

/** `?steps=-20,-10,10,20` as the API and the risk page read it (left out: ±10 % and ±20 %). */
export const sensitivityQuerySchema = z.strictObject({
	steps: z
		.string()
		.optional()
		.transform((text) =>
			text === undefined || text.trim() === ''
				? defaultSensitivitySteps
				: text.split(',').map((part) => (part.trim() === '' ? NaN : Number(part.trim())))
		)
		.pipe(sensitivityStepsSchema)
});

/** `?year=` of the cash-flow API: one plan year, or every year when left out. */
export const cashFlowQuerySchema = z.strictObject({
	year: z.coerce.number().pipe(yearSchema).optional()
});

export const saleMonthSchema = z.strictObject({
	crop: id('the crop'),
	month: month('the sale month')
});

/** Money a family farm holds or keeps on hand: a bound well above any, that catches a slip. */
const cash = (label: string) => amount(label, { min: 0, max: 100_000_000, usdPer: '' });

export const cashFlowSettingsSchema = z.strictObject({
	startingCashUsd: cash('the starting cash'),
	minimumBalanceUsd: cash('the minimum balance'),
	saleMonths: list('sale months', saleMonthSchema, { max: 200 }).refine(
		(months) => new Set(months.map((m) => m.crop)).size === months.length,
		{ error: 'Give each crop one sale month.' }
	)
});
export type CashFlowSettings = z.output<typeof cashFlowSettingsSchema>;

/** Before a farm saves its own: no cash on hand, no minimum, every crop sold at harvest. */
export const defaultCashFlowSettings: CashFlowSettings = {
	startingCashUsd: 0,
	minimumBalanceUsd: 0,
	saleMonths: []
};
