import { z } from 'zod';
import { amount, choice, text } from './messages';

/** A reviewer's decision on a plan version; the database enum and every label follow this list. */
export const reviewDecisions = ['approved', 'changes_requested'] as const;
export type ReviewDecision = (typeof reviewDecisions)[number];

const version = (label: string) => amount(label, { min: 1, max: 1_000_000, integer: true });

/**
 * A reviewer's comment on a plan version, with a decision or without one: the reviews API's body and
 * the review form on the plan page. `version` names the version; without it, the plan's newest.
 * A decision may come without words; a comment alone must say something.
 */
export const reviewSchema = z
	.strictObject({
		comment: text('the comment', { max: 4000 }).default(''),
		decision: choice('the decision', reviewDecisions).optional(),
		version: version('the version reviewed').optional()
	})
	.refine((review) => review.comment !== '' || review.decision !== undefined, {
		path: ['comment'],
		error: 'Write a comment, or give a decision with it.'
	});
export type ReviewInput = z.output<typeof reviewSchema>;

/**
 * Sharing a plan version for review (owner or editor). `version`, when given, must be the plan's newest
 * (a newer save refuses the share, as it does an edit); `message` goes to the reviewers with the e-mail.
 */
export const shareSchema = z.strictObject({
	version: version('the version to share').optional(),
	message: text('the message to the reviewers', { max: 1000 }).default('')
});
export type ShareInput = z.output<typeof shareSchema>;
