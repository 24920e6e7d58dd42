import { json } from '@sveltejs/kit';
import { requireFarmAccess } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import { listFarmMembers } from '$lib/server/db/members';
import type { RequestHandler } from './$types';

/** Who can see the farm, with their roles (any member, as on the farm's home page). */
export const GET: RequestHandler = async (event) => {
	const { farm } = await requireFarmAccess(event, event.params.farmId, 'farm:view');
	return json({ members: await listFarmMembers(db, farm.id) });
};
