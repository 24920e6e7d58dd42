import { json } from '@sveltejs/kit';
import { farmSchema } from '$lib/schemas/farm';
import { invalidInput, readJson } from '$lib/server/api';
import { requireFarmAccess } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import { farmSettingsOf, updateFarm } from '$lib/server/db/farms';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = async (event) => {
	const { farm, role } = await requireFarmAccess(event, event.params.farmId, 'farm:view');
	return json({ farm: farmSettingsOf(farm), role });
};

/** Replaces the farm's settings (owner or editor); labour hours stay the family's when it has people. */
export const PUT: RequestHandler = async (event) => {
	const { user, farm, role } = await requireFarmAccess(event, event.params.farmId, 'farm:edit');
	const body = await readJson(event.request);
	if (!body.ok) return body.response;
	const parsed = farmSchema.safeParse(body.body);
	if (!parsed.success) return invalidInput(parsed.error);
	const saved = await updateFarm(db, farm.id, user.id, parsed.data);
	return json({ farm: { ...farmSettingsOf(farm), ...saved }, role });
};
