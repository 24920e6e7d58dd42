import { json } from '@sveltejs/kit';
import { shareSchema } from '$lib/schemas/reviews';
import { conflict, invalidInput, invalidValue, readJson } from '$lib/server/api';
import { requirePlanAccess } from '$lib/server/auth/access';
import { sharePlan } from '$lib/server/reviews';
import type { RequestHandler } from './$types';

/**
 * Shares the plan's newest version for review (owner or editor) and e-mails the farm's reviewers.
 * Body `{ version?, message? }`; a `version` that is no longer the newest, or a version already
 * awaiting review or approved, gets 409 and nothing changes. 201 `{ share: { version, state,
 * sharedAt, notified } }`.
 */
export const POST: RequestHandler = async (event) => {
	const { user, farm, plan } = await requirePlanAccess(
		event,
		event.params.farmId,
		event.params.planId,
		'plan:edit'
	);
	const body = await readJson(event.request);
	if (!body.ok) return body.response;
	const parsed = shareSchema.safeParse(body.body);
	if (!parsed.success) return invalidInput(parsed.error);
	const outcome = await sharePlan(farm, plan, user, parsed.data, event.url.origin);
	if (!outcome.ok) {
		return outcome.status === 409
			? conflict(outcome.message)
			: invalidValue(outcome.path, outcome.message);
	}
	const { version, sharedAt, notified } = outcome;
	return json(
		{ share: { version, state: 'awaiting_review', sharedAt, notified } },
		{ status: 201 }
	);
};
