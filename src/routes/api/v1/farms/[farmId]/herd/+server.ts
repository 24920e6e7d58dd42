import { error, json } from '@sveltejs/kit';
import { herdSchema } from '$lib/schemas/plan-file';
import { invalidInput, readJson } from '$lib/server/api';
import { requireFarmAccess } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import { deleteHerd, findHerd, saveHerd } from '$lib/server/db/herds';
import type { RequestHandler } from './$types';

/** The farm's herd as the plan file states it: `{ herd }`, null when the farm keeps no cattle. */
export const GET: RequestHandler = async (event) => {
	const { farm } = await requireFarmAccess(event, event.params.farmId, 'farm:view');
	return json({ herd: await findHerd(db, farm.id) });
};

/** Creates or replaces the herd (owner or editor): the plan file's herd, defaults filled in. */
export const PUT: RequestHandler = async (event) => {
	const { user, farm } = await requireFarmAccess(event, event.params.farmId, 'farm:edit');
	const body = await readJson(event.request);
	if (!body.ok) return body.response;
	const parsed = herdSchema.safeParse(body.body);
	if (!parsed.success) return invalidInput(parsed.error);
	return json({ herd: await saveHerd(db, farm.id, user.id, parsed.data) });
};

/** Says the farm keeps no cattle (owner or editor): 204; 404 when it has no herd. Plans keep theirs. */
export const DELETE: RequestHandler = async (event) => {
	const { user, farm } = await requireFarmAccess(event, event.params.farmId, 'farm:edit');
	if (!(await deleteHerd(db, farm.id, user.id))) error(404, 'This farm has no herd.');
	return new Response(null, { status: 204 });
};
