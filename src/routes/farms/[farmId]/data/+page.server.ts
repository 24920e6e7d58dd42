import { requireFarmAccess } from '$lib/server/auth/access';
import { getFarmData } from '$lib/server/db/farm-data';
import type { PageServerLoad } from './$types';

export const load = (async (event) => {
	const { farm } = await requireFarmAccess(event, event.params.farmId, 'farm:view');
	return { farm: { id: farm.id, name: farm.name }, data: await getFarmData(farm.id) };
}) satisfies PageServerLoad;
