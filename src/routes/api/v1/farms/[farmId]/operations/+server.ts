import { json } from '@sveltejs/kit';
import { operationBodySchema } from '$lib/schemas/operations';
import { invalidInput, invalidValue, readJson } from '$lib/server/api';
import { requireFarmAccess } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import { addFieldOperations, listFieldOperations } from '$lib/server/db/field-operations';
import { operationKeyTakenMessage } from '$lib/server/operation-setup';
import type { RequestHandler } from './$types';

/** The farm's operations by month: `{ operations: [{ id, key, name, by, month, … }] }` (US customary). */
export const GET: RequestHandler = async (event) => {
	const { farm } = await requireFarmAccess(event, event.params.farmId, 'farm:view');
	return json({ operations: await listFieldOperations(db, farm.id) });
};

/** Adds an operation (owner or editor): 201 `{ operation }`; its `key` is made when not given. */
export const POST: RequestHandler = async (event) => {
	const { user, farm } = await requireFarmAccess(event, event.params.farmId, 'farm:edit');
	const body = await readJson(event.request);
	if (!body.ok) return body.response;
	const parsed = operationBodySchema.safeParse(body.body);
	if (!parsed.success) return invalidInput(parsed.error);
	const result = await addFieldOperations(db, farm.id, user.id, [parsed.data]);
	if ('keyTaken' in result) {
		return invalidValue('key', operationKeyTakenMessage(result.keyTaken.key));
	}
	return json({ operation: result.added[0] }, { status: 201 });
};
