import { error, json } from '@sveltejs/kit';
import { fieldBodySchema, isJsonObject } from '$lib/schemas/farm-setup';
import { conflict, invalidInput, invalidValue, readJson } from '$lib/server/api';
import { requireFarmAccess } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import { chooseFieldKey, deleteField, findFieldById, updateField } from '$lib/server/db/fields';
import { fieldInUseMessage, fieldKeyTakenMessage } from '$lib/server/farm-setup';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = async (event) => {
	const { farm } = await requireFarmAccess(event, event.params.farmId, 'farm:view');
	return json({ field: await fieldOr404(farm.id, event.params.fieldId) });
};

/** Changes the values the body gives (owner or editor): the stored field with the body over it must be valid. */
export const PATCH: RequestHandler = async (event) => {
	const { user, farm } = await requireFarmAccess(event, event.params.farmId, 'farm:edit');
	const stored = await fieldOr404(farm.id, event.params.fieldId);
	const body = await readJson(event.request);
	if (!body.ok) return body.response;
	const { id, ...values } = stored;
	const input = isJsonObject(body.body) ? { ...values, ...body.body } : body.body;
	const parsed = fieldBodySchema.safeParse(input);
	if (!parsed.success) return invalidInput(parsed.error);
	const field = { ...parsed.data, key: parsed.data.key ?? stored.key };
	const key = await chooseFieldKey(db, farm.id, {
		name: field.name,
		wanted: field.key,
		fieldId: id
	});
	if (key === undefined) return invalidValue('key', fieldKeyTakenMessage(field.key));
	return json({ field: await updateField(db, farm.id, user.id, id, field) });
};

/** Deletes a field (owner or editor); 409 naming the plans when a plan uses it. */
export const DELETE: RequestHandler = async (event) => {
	const { user, farm } = await requireFarmAccess(event, event.params.farmId, 'farm:edit');
	const field = await fieldOr404(farm.id, event.params.fieldId);
	const result = await deleteField(db, farm.id, user.id, field);
	if (!result.deleted) {
		return conflict(fieldInUseMessage(field.name, result.planNames), { plans: result.planNames });
	}
	return new Response(null, { status: 204 });
};

async function fieldOr404(farmId: string, fieldId: string) {
	const field = await findFieldById(db, farmId, fieldId);
	if (!field) error(404, 'Field not found.');
	return field;
}
