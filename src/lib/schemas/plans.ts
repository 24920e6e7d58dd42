import { z } from 'zod';
import { amount, id, text } from './messages';
import { herdSchema, planSchema, yearSchema } from './plan-file';

/**
 * A plan as the plans API and the plan editor take it: the plan file's own `plan` section (fields and
 * rotations by their plan-file keys), the herd the plan runs (null: no cattle) and the document's notes.
 * The farm's fields, practices, rotations and prices come from the farm, so a draft is small.
 */
export const planDraftSchema = z.strictObject({
	plan: planSchema,
	herd: herdSchema.nullable().default(null),
	notes: text('the notes', { max: 4000 }).default('')
});
export type PlanDraft = z.output<typeof planDraftSchema>;
export type PlanDraftInput = z.input<typeof planDraftSchema>;

const changeNote = text('the note on this version', { max: 500 }).default('');
const version = (label: string) => amount(label, { min: 1, max: 1_000_000, integer: true });

/** A new plan: a draft and a note for its first version. */
export const planCreateSchema = planDraftSchema.extend({ changeNote });

/** A save: the draft, the version it was edited from (a newer one refuses it) and a note. */
export const planSaveSchema = planDraftSchema.extend({
	baseVersion: version('the version this edit started from'),
	changeNote
});

/** A copy of a plan's current version under a new name. */
export const planCopySchema = planSchema.pick({ name: true });

/** Restoring an older version saves it again as the newest. */
export const planRestoreSchema = z.strictObject({
	version: version('the version to restore'),
	baseVersion: version('the version this edit started from')
});

/** How much of the results to answer: the summary the editor shows, or every field-year too. */
export const resultDetails = ['summary', 'full'] as const;
export const resultsQuerySchema = z.strictObject({
	version: z.coerce.number().pipe(version('the version')).optional(),
	against: z.uuid({ error: 'Name the plan to compare against by its id.' }).optional(),
	detail: z.enum(resultDetails, { error: 'The detail is "summary" or "full".' }).default('summary'),
	/** With `full`: only this field's field-years (its plan-file key), and with `year` only that year. */
	field: id('the field').optional(),
	year: z.coerce.number().pipe(yearSchema).optional()
});
export type ResultsQuery = z.output<typeof resultsQuerySchema>;
