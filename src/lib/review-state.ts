/**
 * Where a plan version stands in review, from its shares and decisions: one rule for the plan page,
 * the report, the reviewer's home and the API. Safe for the browser.
 */
import type { ReviewDecision } from './schemas/reviews';

export const reviewStates = [
	'not_shared',
	'awaiting_review',
	'changes_requested',
	'approved'
] as const;
export type ReviewState = (typeof reviewStates)[number];

export const reviewStateLabels = {
	not_shared: 'Not yet shared',
	awaiting_review: 'Awaiting review',
	changes_requested: 'Changes requested',
	approved: 'Approved'
} as const satisfies Record<ReviewState, string>;

export const decisionLabels = {
	approved: 'Approved',
	changes_requested: 'Changes requested'
} as const satisfies Record<ReviewDecision, string>;

/** A share or a decision on one version, with who and when. */
export interface ReviewEvent {
	kind: 'share' | ReviewDecision;
	by: string;
	at: Date;
}

export interface VersionReviewState {
	state: ReviewState;
	/** Who shared it (awaiting review) or decided (approved, changes requested); null when not shared. */
	by: string | null;
	at: Date | null;
}

/**
 * A version's state: not shared until someone shares it; then awaiting review until a reviewer decides
 * after the newest share; then the newest such decision. A version shared again after changes were
 * requested awaits review again. An edit makes a new version, so a decision never moves to another.
 */
export function versionReviewState(events: readonly ReviewEvent[]): VersionReviewState {
	const sorted = [...events].sort((a, b) => a.at.getTime() - b.at.getTime());
	const share = sorted.findLast((e) => e.kind === 'share');
	if (!share) return { state: 'not_shared', by: null, at: null };
	const decision = sorted.findLast((e) => e.kind !== 'share' && e.at >= share.at);
	if (!decision) return { state: 'awaiting_review', by: share.by, at: share.at };
	return { state: decision.kind as ReviewDecision, by: decision.by, at: decision.at };
}

/** The order a reviewer's list shows states in: what waits for them first. */
export const reviewStateOrder = {
	awaiting_review: 0,
	changes_requested: 1,
	not_shared: 2,
	approved: 3
} as const satisfies Record<ReviewState, number>;
