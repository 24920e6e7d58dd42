import { json } from '@sveltejs/kit';
import { farmSchema } from '$lib/schemas/farm';
import { invalidInput, readJson } from '$lib/server/api';
import { requireUser } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import { createFarm, listFarmsForUser } from '$lib/server/db/farms';
import type { RequestHandler } from './$types';

/** The signed-in user's farms: `{ farms: [{ id, name, role }] }`. */
export const GET: RequestHandler = async (event) => {
	const user = requireUser(event);
	const farms = await listFarmsForUser(db, user.id);
	return json({ farms: farms.map(({ id, name, role }) => ({ id, name, role })) });
};

/** Creates a farm with the signed-in user as owner: 201 `{ farm: { id, name, role } }`. */
export const POST: RequestHandler = async (event) => {
	const user = requireUser(event);
	const body = await readJson(event.request);
	if (!body.ok) return body.response;
	const parsed = farmSchema.safeParse(body.body);
	if (!parsed.success) return invalidInput(parsed.error);
	const farm = await createFarm(db, user.id, parsed.data);
	return json({ farm: { id: farm.id, name: farm.name, role: farm.role } }, { status: 201 });
};
