import { json } from '@sveltejs/kit';
import { fieldBodySchema } from '$lib/schemas/farm-setup';
import { invalidInput, invalidValue, readJson } from '$lib/server/api';
import { requireFarmAccess } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import { chooseFieldKey, insertField, listFields } from '$lib/server/db/fields';
import { fieldKeyTakenMessage } from '$lib/server/farm-setup';
import type { RequestHandler } from './$types';

/** The farm's fields by name: `{ fields: [{ id, key, name, acres, … }] }` (US customary). */
export const GET: RequestHandler = async (event) => {
	const { farm } = await requireFarmAccess(event, event.params.farmId, 'farm:view');
	return json({ fields: await listFields(db, farm.id) });
};

/** Adds a field (owner or editor): 201 `{ field }`; its `key` is made from the name when not given. */
export const POST: RequestHandler = async (event) => {
	const { user, farm } = await requireFarmAccess(event, event.params.farmId, 'farm:edit');
	const body = await readJson(event.request);
	if (!body.ok) return body.response;
	const parsed = fieldBodySchema.safeParse(body.body);
	if (!parsed.success) return invalidInput(parsed.error);
	const { key: wanted, ...field } = parsed.data;
	const key = await chooseFieldKey(db, farm.id, { name: field.name, wanted });
	if (key === undefined) return invalidValue('key', fieldKeyTakenMessage(wanted!));
	const saved = await insertField(db, farm.id, user.id, { ...field, key });
	return json({ field: saved }, { status: 201 });
};
