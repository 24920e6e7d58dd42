import { requireSiteAdmin } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import { listUsers } from '$lib/server/db/users';
import type { PageServerLoad } from './$types';

export const load = (async (event) => {
	requireSiteAdmin(event);
	return { users: await listUsers(db) };
}) satisfies PageServerLoad;
