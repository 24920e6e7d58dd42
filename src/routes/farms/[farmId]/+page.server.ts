import { requireFarmAccess, roleAllows } from '$lib/server/auth/access';
import { getFarmSetup } from '$lib/server/db/farms';
import type { PageServerLoad } from './$types';

export const load = (async (event) => {
	const { farm, role } = await requireFarmAccess(event, event.params.farmId, 'farm:view');
	return {
		farm: { id: farm.id, name: farm.name, region: farm.region, unitSystem: farm.unitSystem },
		role,
		canEdit: roleAllows(role, 'farm:edit'),
		setup: await getFarmSetup(farm.id)
	};
}) satisfies PageServerLoad;
