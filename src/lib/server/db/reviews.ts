// Review of plan versions: shares, comments and decisions, and the state each version is in.
import { and, asc, eq, inArray, type SQL } from 'drizzle-orm';
import type { FarmRole } from '$lib/roles';
import {
	versionReviewState,
	type ReviewEvent,
	type ReviewState,
	type VersionReviewState
} from '$lib/review-state';
import type { ReviewDecision } from '$lib/schemas/reviews';
import { insertAuditEntry } from './audit';
import { readAll, type Db, type Tx } from './client';
import { comments, memberships, planShares, planVersions, reviews, users } from './schema';

/** How a person is named in the review history: their name, else their e-mail. */
const personName = (name: string | null, email: string | null) =>
	name ?? email ?? 'a removed account';

/** The shares of the versions of the plans `plans` picks, with who shared each. */
const shareRows = (db: Db | Tx, plans: SQL) =>
	db
		.select({
			id: planShares.id,
			planId: planVersions.planId,
			version: planVersions.version,
			name: users.name,
			email: users.email,
			text: planShares.message,
			at: planShares.createdAt
		})
		.from(planShares)
		.innerJoin(planVersions, eq(planVersions.id, planShares.planVersionId))
		.leftJoin(users, eq(users.id, planShares.sharedById))
		.where(plans);

/** The decisions on the versions of the plans `plans` picks, with who decided each. */
const decisionRows = (db: Db | Tx, plans: SQL) =>
	db
		.select({
			id: reviews.id,
			planId: planVersions.planId,
			version: planVersions.version,
			name: users.name,
			email: users.email,
			text: reviews.note,
			decision: reviews.decision,
			at: reviews.createdAt
		})
		.from(reviews)
		.innerJoin(planVersions, eq(planVersions.id, reviews.planVersionId))
		.leftJoin(users, eq(users.id, reviews.reviewerId))
		.where(plans);

/** One entry of a plan's review history: a share, a comment, or a decision with its comment. */
export interface ReviewEntry {
	id: string;
	kind: 'share' | 'comment' | ReviewDecision;
	version: number;
	by: string;
	/** The comment, the decision's comment or the message sent with a share. */
	text: string;
	at: Date;
}

/** Every share, comment and decision on every version of a plan, oldest first. */
export async function listReviewEntries(db: Db | Tx, planId: string): Promise<ReviewEntry[]> {
	const ofPlan = eq(planVersions.planId, planId);
	const [shares, commentRows, decisions] = await readAll(db, [
		() => shareRows(db, ofPlan),
		() =>
			db
				.select({
					id: comments.id,
					version: planVersions.version,
					name: users.name,
					email: users.email,
					text: comments.body,
					at: comments.createdAt
				})
				.from(comments)
				.innerJoin(planVersions, eq(planVersions.id, comments.planVersionId))
				.leftJoin(users, eq(users.id, comments.authorId))
				.where(ofPlan),
		() => decisionRows(db, ofPlan)
	]);
	const entry =
		(kind: (row: { decision?: ReviewDecision }) => ReviewEntry['kind']) =>
		(row: {
			id: string;
			version: number;
			name: string | null;
			email: string | null;
			text: string;
			at: Date;
			decision?: ReviewDecision;
		}): ReviewEntry => ({
			id: row.id,
			kind: kind(row),
			version: row.version,
			by: personName(row.name, row.email),
			text: row.text,
			at: row.at
		});
	return [
		...shares.map(entry(() => 'share')),
		...commentRows.map(entry(() => 'comment')),
		...decisions.map(entry((row) => row.decision!))
	].sort((a, b) => a.at.getTime() - b.at.getTime() || a.id.localeCompare(b.id));
}

/** Each version's review state from a plan's history (versions with no entry are not shared). */
export function statesByVersion(entries: readonly ReviewEntry[]): Map<number, VersionReviewState> {
	const events = new Map<number, ReviewEvent[]>();
	for (const e of entries) {
		if (e.kind === 'comment') continue;
		const list = events.get(e.version) ?? [];
		list.push({ kind: e.kind, by: e.by, at: e.at });
		events.set(e.version, list);
	}
	return new Map([...events].map(([version, list]) => [version, versionReviewState(list)]));
}

export const notShared: VersionReviewState = { state: 'not_shared', by: null, at: null };

/**
 * The review state of every version of many plans at once (the reviewer's home): plan id → version →
 * state. Versions never shared are absent.
 */
export async function reviewStatesOfPlans(db: Db | Tx, planIds: string[]) {
	const byPlan = new Map<string, Map<number, VersionReviewState>>();
	if (!planIds.length) return byPlan;
	const ofPlans = inArray(planVersions.planId, planIds);
	const [shares, decisions] = await readAll(db, [
		() => shareRows(db, ofPlans),
		() => decisionRows(db, ofPlans)
	]);
	const events = new Map<string, Map<number, ReviewEvent[]>>();
	const add = (planId: string, version: number, event: ReviewEvent) => {
		const versions = events.get(planId) ?? new Map<number, ReviewEvent[]>();
		events.set(planId, versions);
		versions.set(version, [...(versions.get(version) ?? []), event]);
	};
	for (const row of shares) {
		add(row.planId, row.version, {
			kind: 'share',
			by: personName(row.name, row.email),
			at: row.at
		});
	}
	for (const row of decisions) {
		add(row.planId, row.version, {
			kind: row.decision,
			by: personName(row.name, row.email),
			at: row.at
		});
	}
	for (const [planId, versions] of events) {
		byPlan.set(
			planId,
			new Map([...versions].map(([version, list]) => [version, versionReviewState(list)]))
		);
	}
	return byPlan;
}

/** A plan version's row id and review state, read inside the caller's transaction (locked for update). */
async function lockVersion(tx: Tx, planId: string, version: number) {
	const [row] = await tx
		.select({ id: planVersions.id })
		.from(planVersions)
		.where(and(eq(planVersions.planId, planId), eq(planVersions.version, version)))
		.for('update');
	if (!row) return undefined;
	const [shareRows, reviewRows] = await readAll(tx, [
		() =>
			tx
				.select({ at: planShares.createdAt })
				.from(planShares)
				.where(eq(planShares.planVersionId, row.id)),
		() =>
			tx
				.select({ decision: reviews.decision, at: reviews.createdAt })
				.from(reviews)
				.where(eq(reviews.planVersionId, row.id))
	]);
	const state = versionReviewState([
		...shareRows.map((r) => ({ kind: 'share' as const, by: '', at: r.at })),
		...reviewRows.map((r) => ({ kind: r.decision, by: '', at: r.at }))
	]).state;
	return { id: row.id, state };
}

export type ShareOutcome =
	| { shared: true; sharedAt: Date }
	| { shared: false; reason: 'no-version' | 'awaiting_review' | 'approved' };

/**
 * Shares a plan version for review, with its audit entry, in one transaction. A version already
 * awaiting review or approved is not shared again (nothing changes); one with changes requested may be.
 */
export async function sharePlanVersion(
	db: Db,
	share: {
		farmId: string;
		planId: string;
		planName: string;
		version: number;
		userId: string;
		message: string;
	}
): Promise<ShareOutcome> {
	return db.transaction(async (tx) => {
		const locked = await lockVersion(tx, share.planId, share.version);
		if (!locked) return { shared: false, reason: 'no-version' };
		if (locked.state === 'awaiting_review' || locked.state === 'approved') {
			return { shared: false, reason: locked.state };
		}
		const [row] = await tx
			.insert(planShares)
			.values({ planVersionId: locked.id, sharedById: share.userId, message: share.message })
			.returning({ at: planShares.createdAt });
		await insertAuditEntry(tx, {
			farmId: share.farmId,
			userId: share.userId,
			action: 'plan.shared',
			detail: { planId: share.planId, name: share.planName, version: share.version }
		});
		return { shared: true, sharedAt: row.at };
	});
}

export type ReviewOutcome =
	| { saved: true; id: string; at: Date; state: ReviewState }
	| { saved: false; reason: 'no-version' | 'not-shared' };

/**
 * A reviewer's comment (a `comments` row) or decision with its comment (a `reviews` row) on a plan
 * version, with its audit entry, in one transaction. A decision needs the version to have been shared.
 */
export async function insertReview(
	db: Db,
	review: {
		farmId: string;
		planId: string;
		planName: string;
		version: number;
		userId: string;
		comment: string;
		decision?: ReviewDecision;
	}
): Promise<ReviewOutcome> {
	return db.transaction(async (tx) => {
		const locked = await lockVersion(tx, review.planId, review.version);
		if (!locked) return { saved: false, reason: 'no-version' };
		let row: { id: string; at: Date };
		if (review.decision) {
			if (locked.state === 'not_shared') return { saved: false, reason: 'not-shared' };
			[row] = await tx
				.insert(reviews)
				.values({
					planVersionId: locked.id,
					reviewerId: review.userId,
					decision: review.decision,
					note: review.comment
				})
				.returning({ id: reviews.id, at: reviews.createdAt });
		} else {
			[row] = await tx
				.insert(comments)
				.values({ planVersionId: locked.id, authorId: review.userId, body: review.comment })
				.returning({ id: comments.id, at: comments.createdAt });
		}
		await insertAuditEntry(tx, {
			farmId: review.farmId,
			userId: review.userId,
			action: 'plan.reviewed',
			detail: {
				planId: review.planId,
				name: review.planName,
				version: review.version,
				kind: review.decision ?? 'comment'
			}
		});
		return { saved: true, ...row, state: review.decision ?? locked.state };
	});
}

/** The farm's members with these roles, with their e-mail addresses: whom a notification goes to. */
export async function listMembersWithRoles(db: Db | Tx, farmId: string, roles: FarmRole[]) {
	return db
		.select({ id: users.id, name: users.name, email: users.email, role: memberships.role })
		.from(memberships)
		.innerJoin(users, eq(users.id, memberships.userId))
		.where(and(eq(memberships.farmId, farmId), inArray(memberships.role, roles)))
		.orderBy(asc(users.email));
}
