import { json } from '@sveltejs/kit';
import { reviewSchema } from '$lib/schemas/reviews';
import { conflict, invalidInput, invalidValue, readJson } from '$lib/server/api';
import { requirePlanAccess } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import { listPlanVersions } from '$lib/server/db/plans';
import { listReviewEntries, notShared, statesByVersion } from '$lib/server/db/reviews';
import { reviewPlan } from '$lib/server/reviews';
import type { RequestHandler } from './$types';

/**
 * The plan's review (any member): each version's state with who and when, newest version first, and
 * every share, comment and decision, oldest first.
 */
export const GET: RequestHandler = async (event) => {
	const { plan } = await requirePlanAccess(
		event,
		event.params.farmId,
		event.params.planId,
		'farm:view'
	);
	const [versions, entries] = await Promise.all([
		listPlanVersions(db, plan.id),
		listReviewEntries(db, plan.id)
	]);
	const states = statesByVersion(entries);
	return json({
		plan: { id: plan.id, name: plan.name, currentVersion: plan.currentVersion },
		versions: versions.map(({ version }) => ({ version, ...(states.get(version) ?? notShared) })),
		entries
	});
};

/**
 * A reviewer's comment, with a decision (`approved` or `changes_requested`) or without one, on the
 * plan's newest version or on `version`; e-mails the farm's owners and editors. A decision on a version
 * not shared for review gets 409; nothing changes on any refusal. 201 `{ review: { id, version, kind,
 * comment, state, at, notified } }`.
 */
export const POST: RequestHandler = async (event) => {
	const { user, farm, plan } = await requirePlanAccess(
		event,
		event.params.farmId,
		event.params.planId,
		'plan:review'
	);
	const body = await readJson(event.request);
	if (!body.ok) return body.response;
	const parsed = reviewSchema.safeParse(body.body);
	if (!parsed.success) return invalidInput(parsed.error);
	const outcome = await reviewPlan(farm, plan, user, parsed.data, event.url.origin);
	if (!outcome.ok) {
		return outcome.status === 409
			? conflict(outcome.message)
			: invalidValue(outcome.path, outcome.message);
	}
	const { id, version, at, state, notified } = outcome;
	return json(
		{
			review: {
				id,
				version,
				kind: parsed.data.decision ?? 'comment',
				comment: parsed.data.comment,
				state,
				at,
				notified
			}
		},
		{ status: 201 }
	);
};
