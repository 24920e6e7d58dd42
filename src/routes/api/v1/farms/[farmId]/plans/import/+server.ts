import { json } from '@sveltejs/kit';
import { parsePlanDocument } from '$lib/schemas/plan-file';
import { readJson } from '$lib/server/api';
import { requireFarmAccess } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import { importCheckedPlan } from '$lib/server/plans';
import type { RequestHandler } from './$types';

/**
 * Adds the plan of a plan file (format 1 or 2) to the farm, with the fields, practices, rotations and
 * prices it names that the farm does not have yet (parts the farm has under the same id are kept as
 * they are); owner or editor. A file with any problem, or a plan that does not work with the parts the
 * farm kept: 422 naming the path of each, nothing saved.
 * 201 `{ plan: { id, name, version } }`.
 */
export const POST: RequestHandler = async (event) => {
	const { user, farm } = await requireFarmAccess(event, event.params.farmId, 'plan:edit');
	const body = await readJson(event.request);
	if (!body.ok) return body.response;
	const parsed = parsePlanDocument(body.body);
	if (!parsed.ok) {
		return json(
			{ message: 'The plan file is not valid: nothing was saved.', issues: parsed.issues },
			{ status: 422 }
		);
	}
	const saved = await importCheckedPlan(db, farm, user.id, parsed.plan);
	if (!saved.ok) {
		return json(
			{
				message:
					'The plan does not work with the parts this farm already has under the same ids: nothing was saved.',
				issues: saved.issues
			},
			{ status: 422 }
		);
	}
	return json(
		{ plan: { id: saved.planId, name: parsed.plan.plan.name, version: 1 } },
		{ status: 201 }
	);
};
