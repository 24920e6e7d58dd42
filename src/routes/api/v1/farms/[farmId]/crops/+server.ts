import { json } from '@sveltejs/kit';
import { cropSchema } from '$lib/schemas/crops';
import { cropBodySchema } from '$lib/schemas/farm-setup';
import { invalidInput, invalidValue, readJson } from '$lib/server/api';
import { requireFarmAccess } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import {
	chooseCropId,
	insertCrop,
	isBuiltInCrop,
	listCropsWithBuiltIns
} from '$lib/server/db/crops';
import { cropIdTakenMessage } from '$lib/server/farm-setup';
import type { RequestHandler } from './$types';

/** The built-in crops and then the farm's own: `{ crops: [{ id, name, soldBy, …, builtIn }] }`. */
export const GET: RequestHandler = async (event) => {
	const { farm } = await requireFarmAccess(event, event.params.farmId, 'farm:view');
	return json({ crops: await listCropsWithBuiltIns(db, farm.id) });
};

/** Adds a crop of the farm's own (owner or editor): 201 `{ crop }`; its id is made from the name when not given. */
export const POST: RequestHandler = async (event) => {
	const { user, farm } = await requireFarmAccess(event, event.params.farmId, 'farm:edit');
	const body = await readJson(event.request);
	if (!body.ok) return body.response;
	const shape = cropBodySchema.safeParse(body.body);
	if (!shape.success) return invalidInput(shape.error);
	const wanted = shape.data.id;
	const id = await chooseCropId(db, farm.id, { name: shape.data.name, wanted });
	if (id === undefined) {
		return invalidValue('id', cropIdTakenMessage(wanted!, isBuiltInCrop(wanted!)));
	}
	const parsed = cropSchema.safeParse({ ...shape.data, id });
	if (!parsed.success) return invalidInput(parsed.error);
	const crop = await insertCrop(db, farm.id, user.id, parsed.data);
	return json({ crop: { ...crop, builtIn: false } }, { status: 201 });
};
