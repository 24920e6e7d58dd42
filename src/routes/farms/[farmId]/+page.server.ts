import { requireFarmAccess, roleAllows } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import { getFarmSetup, listMembers } from '$lib/server/db/farms';
import type { PageServerLoad } from './$types';

export const load = (async (event) => {
	const { farm, role } = await requireFarmAccess(event, event.params.farmId, 'farm:view');
	const [setup, members] = await Promise.all([getFarmSetup(db, farm.id), listMembers(db, farm.id)]);
	return {
		farm: { id: farm.id, name: farm.name, region: farm.region },
		role,
		canEdit: roleAllows(role, 'farm:edit'),
		canManageMembers: roleAllows(role, 'members:manage'),
		canSeeRecord: roleAllows(role, 'farm:audit'),
		setup,
		members
	};
}) satisfies PageServerLoad;
