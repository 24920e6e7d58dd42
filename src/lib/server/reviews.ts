// What the reviews API and the plan page share: sharing a version, a reviewer's comment or decision,
// each refusal worded once, and the e-mails they send once the database has them.
import { env } from '$env/dynamic/private';
import type { ReviewState } from '$lib/review-state';
import type { ReviewInput, ShareInput } from '$lib/schemas/reviews';
import type { SessionUser } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import type { PlanRow } from '$lib/server/db/plans';
import { insertReview, listMembersWithRoles, sharePlanVersion } from '$lib/server/db/reviews';
import type { farms } from '$lib/server/db/schema';
import { sendMail } from '$lib/server/mail';
import { reviewMessages, shareMessages, type MailMessage } from './review-mail';

type Farm = typeof farms.$inferSelect;

/** A refusal the API answers with its status (and a form shows beside the field `path`). */
export interface ReviewRefusal {
	ok: false;
	status: 409 | 422;
	path: string;
	message: string;
}

const refusal = (status: 409 | 422, path: string, message: string): ReviewRefusal => ({
	ok: false,
	status,
	path,
	message
});

const displayName = (user: SessionUser) => user.name ?? user.email;

/** The app's own origin for links in e-mail: ORIGIN when set (it is in production), else the request's. */
function appOrigin(requestOrigin: string) {
	return env.ORIGIN || requestOrigin;
}

/**
 * Sends each message; a message that fails is logged and the rest still go (the share or review is
 * saved by then, and the plan page shows it to everyone). How many went.
 */
async function deliver(messages: MailMessage[]) {
	const sent = await Promise.allSettled(messages.map((message) => sendMail(message)));
	sent.forEach((outcome, i) => {
		if (outcome.status === 'rejected') {
			console.error(`Review e-mail to ${messages[i].to} was not sent:`, outcome.reason);
		}
	});
	return sent.filter((outcome) => outcome.status === 'fulfilled').length;
}

export function notNewestMessage(version: number, currentVersion: number) {
	return `Only the newest version can be shared: version ${version} was followed by version ${currentVersion}. Open the newest version and share that.`;
}

/**
 * Shares a version of the plan (the newest unless `version` names it, which must then be the newest)
 * and e-mails the farm's reviewers.
 */
export async function sharePlan(
	farm: Farm,
	plan: PlanRow,
	user: SessionUser,
	input: ShareInput,
	requestOrigin: string
): Promise<{ ok: true; version: number; sharedAt: Date; notified: number } | ReviewRefusal> {
	const version = input.version ?? plan.currentVersion;
	if (version !== plan.currentVersion) {
		return refusal(409, 'version', notNewestMessage(version, plan.currentVersion));
	}
	const outcome = await sharePlanVersion(db, {
		farmId: farm.id,
		planId: plan.id,
		planName: plan.name,
		version,
		userId: user.id,
		message: input.message
	});
	if (!outcome.shared) {
		return refusal(
			409,
			'version',
			outcome.reason === 'approved'
				? `Version ${version} is approved already. Save a new version to share changes.`
				: `Version ${version} is already awaiting review.`
		);
	}
	const reviewers = await listMembersWithRoles(db, farm.id, ['reviewer']);
	const notified = await deliver(
		shareMessages(
			{ ...planRef(farm, plan, version), origin: appOrigin(requestOrigin) },
			displayName(user),
			input.message,
			reviewers.filter((r) => r.id !== user.id)
		)
	);
	return { ok: true, version, sharedAt: outcome.sharedAt, notified };
}

/**
 * A reviewer's comment or decision on a version of the plan (the newest unless `version` names
 * another), then an e-mail to the farm's owners and editors.
 */
export async function reviewPlan(
	farm: Farm,
	plan: PlanRow,
	user: SessionUser,
	input: ReviewInput,
	requestOrigin: string
): Promise<
	| { ok: true; id: string; version: number; at: Date; state: ReviewState; notified: number }
	| ReviewRefusal
> {
	const version = input.version ?? plan.currentVersion;
	const outcome = await insertReview(db, {
		farmId: farm.id,
		planId: plan.id,
		planName: plan.name,
		version,
		userId: user.id,
		comment: input.comment,
		decision: input.decision
	});
	if (!outcome.saved) {
		return outcome.reason === 'no-version'
			? refusal(422, 'version', `This plan has no version ${version}.`)
			: refusal(
					409,
					'decision',
					`Version ${version} has not been shared for review: a decision waits until the owner or an editor shares it. A comment may be sent now.`
				);
	}
	const recipients = await listMembersWithRoles(db, farm.id, ['owner', 'editor']);
	const notified = await deliver(
		reviewMessages(
			{ ...planRef(farm, plan, version), origin: appOrigin(requestOrigin) },
			displayName(user),
			input,
			recipients.filter((r) => r.id !== user.id)
		)
	);
	return { ok: true, id: outcome.id, version, at: outcome.at, state: outcome.state, notified };
}

function planRef(farm: Farm, plan: PlanRow, version: number) {
	return {
		farmId: farm.id,
		farmName: farm.name,
		planId: plan.id,
		planName: plan.name,
		version
	};
}
