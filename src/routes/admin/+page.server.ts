import { requireSiteAdmin } from '$lib/server/auth/access';
import { listUsers } from '$lib/server/db/users';
import type { PageServerLoad } from './$types';

export const load = (async (event) => {
	requireSiteAdmin(event);
	return { users: await listUsers() };
}) satisfies PageServerLoad;
