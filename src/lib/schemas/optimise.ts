import { z } from 'zod';
import { amount, id, list, month, percent } from './messages';

/**
 * What the optimiser is asked: the limits it must keep, the weights it puts on hours, N, diesel and
 * grazing beyond their prices, and whether each field takes one rotation whole. Every limit left out
 * (null) is not applied; every weight defaults to 0. Shared by the CLI's `--options` file,
 * `POST /api/v1/optimise` and the farm's optimiser page.
 */

const cropLimitSchema = z.strictObject({
	cropId: id('the crop'),
	minAcres: amount('the least acres of the crop', { min: 0, max: 1_000_000, unit: 'acres' })
		.nullable()
		.default(null),
	maxAcres: amount('the most acres of the crop', { min: 0, max: 1_000_000, unit: 'acres' })
		.nullable()
		.default(null),
	maxSharePercent: percent('the largest share of the farm in the crop', { min: 0, max: 100 })
		.nullable()
		.default(null)
});

const fixedFieldSchema = z.strictObject({
	fieldId: id('the field'),
	rotationId: id('the rotation'),
	startingPhase: amount('the starting phase', { min: 1, max: 30, integer: true })
		.nullable()
		.default(null)
		.describe('null: the optimiser chooses the phase.')
});

/** The months of a span, January = 1; a span may wrap past December (11, 12, 1). */
const monthSpanSchema = list('months', month('a month'), { min: 1, max: 12 });

export const optimiseLimitsSchema = z.strictObject({
	familyLabourHoursByMonth: list(
		'family hours for each month',
		// 31 days × 24 h: more than that is a typing slip.
		amount('family hours in a month', { min: 0, max: 744, unit: 'hours' }),
		{ max: 12 }
	)
		.length(12, { error: 'Give family hours for all 12 months, January to December.' })
		.nullable()
		.default(null)
		.describe("null: the farm's own hours (its people's, summed)."),
	familyLabourSpan: z
		.strictObject({
			months: monthSpanSchema,
			maxHours: amount('the family hours in those months', {
				min: 0,
				max: 8_760,
				unit: 'hours a year'
			})
		})
		.nullable()
		.default(null)
		.describe(
			'A cap on the family hours in a span of months, each year (the trade-off sweeps it).'
		),
	nitrogenPurchasedLbPerYear: amount('the purchased N limit', {
		min: 0,
		max: 100_000_000,
		unit: 'lb N a year'
	})
		.nullable()
		.default(null),
	dieselGallonsPerYear: amount('the diesel limit', {
		min: 0,
		max: 10_000_000,
		unit: 'gallons a year'
	})
		.nullable()
		.default(null),
	crops: list('crop limits', cropLimitSchema, { max: 50 }).default([]),
	fixedFields: list('fixed fields', fixedFieldSchema, { max: 2000 }).default([]),
	rotationIds: list('rotations to choose from', id('the rotation'), { min: 1, max: 500 })
		.nullable()
		.default(null)
		.describe("null: every rotation of the plan's farm.")
});

export const optimiseWeightsSchema = z.strictObject({
	familyLabourUsdPerHour: amount('the value of a family hour', {
		min: 0,
		max: 500,
		usdPer: 'hour'
	}).default(0),
	nitrogenUsdPerLb: amount('the extra charge on N', { min: 0, max: 20, usdPer: 'lb N' }).default(0),
	dieselUsdPerGallon: amount('the extra charge on diesel', {
		min: 0,
		max: 20,
		usdPer: 'gallon'
	}).default(0),
	grazingUsdPerAuDay: amount('the value of grazing', { min: 0, max: 10, usdPer: 'AU-day' }).default(
		0
	)
});

export const optimiseOptionsSchema = z.strictObject({
	wholeFields: z.boolean({ error: 'Whole fields is yes or no.' }).default(false),
	timeLimitSeconds: amount('the time limit', { above: 0, max: 60, unit: 'seconds' }).default(10),
	// Whole fields find the best answer fast but take long to prove it: on the demo farm 0.5 % took
	// 0.7 s and 0.1 % took 3.8 s for the same answer (measured with HiGHS 1.15.3).
	gapPercent: percent('the gap to stop at', { max: 10 })
		.default(0.5)
		.describe('Whole fields: stop once the answer is within this much of the best possible.'),
	limits: optimiseLimitsSchema.default(() => optimiseLimitsSchema.parse({})),
	weights: optimiseWeightsSchema.default(() => optimiseWeightsSchema.parse({}))
});
export type OptimiseOptions = z.output<typeof optimiseOptionsSchema>;
export type OptimiseOptionsInput = z.input<typeof optimiseOptionsSchema>;

/** `POST /api/v1/optimise`: a plan file (format 1 or 2, read by `parsePlanDocument`) and the options. */
export const optimiseRequestSchema = z.strictObject({
	plan: z.unknown(),
	options: optimiseOptionsSchema.default(() => optimiseOptionsSchema.parse({}))
});

export const sweptLimits = ['family-labour', 'nitrogen'] as const;

/** A trade-off curve: one limit swept from `from` to `to` over `points` solves. */
export const tradeOffSchema = z
	.strictObject({
		options: optimiseOptionsSchema.default(() => optimiseOptionsSchema.parse({})),
		sweep: z.strictObject({
			limit: z.enum(sweptLimits, { error: 'Sweep "family-labour" or "nitrogen".' }),
			months: monthSpanSchema
				.nullable()
				.default(null)
				.describe('family-labour only: the span of months whose hours are swept.'),
			from: amount('the sweep start', { min: 0, max: 100_000_000 }),
			to: amount('the sweep end', { min: 0, max: 100_000_000 }),
			points: amount('the number of points', { min: 2, max: 60, integer: true }).default(20)
		})
	})
	.refine((t) => t.sweep.to > t.sweep.from, {
		path: ['sweep', 'to'],
		error: 'The sweep must end above where it starts.'
	})
	.refine((t) => t.sweep.limit !== 'family-labour' || t.sweep.months !== null, {
		path: ['sweep', 'months'],
		error: 'Choose the months whose family hours are swept.'
	});
export type TradeOffRequest = z.output<typeof tradeOffSchema>;
