import { error, json } from '@sveltejs/kit';
import { isJsonObject } from '$lib/schemas/farm-setup';
import { operationBodySchema } from '$lib/schemas/operations';
import { conflict, invalidInput, invalidValue, readJson } from '$lib/server/api';
import { requireFarmAccess } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import {
	deleteFieldOperation,
	findFieldOperationById,
	isFieldOperationKeyFree,
	updateFieldOperation,
	type OperationRow
} from '$lib/server/db/field-operations';
import { operationInUseMessage, operationKeyTakenMessage } from '$lib/server/operation-setup';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = async (event) => {
	const { farm } = await requireFarmAccess(event, event.params.farmId, 'farm:view');
	return json({ operation: await operationOr404(farm.id, event.params.operationId) });
};

/**
 * Changes the values the body gives (owner or editor): the stored operation with the body over it must
 * be valid. A body that changes `by` or `statedAs` keeps only the name, month, `by`, key and copiedFrom, and
 * gives the rest; a `fuel` in the body replaces the stored one.
 */
export const PATCH: RequestHandler = async (event) => {
	const { user, farm } = await requireFarmAccess(event, event.params.farmId, 'farm:edit');
	const stored = await operationOr404(farm.id, event.params.operationId);
	const body = await readJson(event.request);
	if (!body.ok) return body.response;
	const input = isJsonObject(body.body) ? mergedOver(stored, body.body) : body.body;
	const parsed = operationBodySchema.safeParse(input);
	if (!parsed.success) return invalidInput(parsed.error);
	const operation = { ...parsed.data, key: parsed.data.key ?? stored.key };
	if (!(await isFieldOperationKeyFree(db, farm.id, operation.key, stored.id))) {
		return invalidValue('key', operationKeyTakenMessage(operation.key));
	}
	return json({
		operation: await updateFieldOperation(db, farm.id, user.id, stored.id, operation)
	});
};

/** Deletes an operation (owner or editor); 409 naming the practices when a practice uses it. */
export const DELETE: RequestHandler = async (event) => {
	const { user, farm } = await requireFarmAccess(event, event.params.farmId, 'farm:edit');
	const operation = await operationOr404(farm.id, event.params.operationId);
	const result = await deleteFieldOperation(db, farm.id, user.id, operation);
	if (!result.deleted) {
		return conflict(operationInUseMessage(operation.name, result.practiceNames), {
			practices: result.practiceNames
		});
	}
	return new Response(null, { status: 204 });
};

async function operationOr404(farmId: string, operationId: string) {
	const operation = await findFieldOperationById(db, farmId, operationId);
	if (!operation) error(404, 'Operation not found.');
	return operation;
}

/** The body over the stored operation; over its name, month, `by`, key and copiedFrom only when it changes kind. */
function mergedOver({ id: _id, ...values }: OperationRow, body: Record<string, unknown>) {
	const storedStatedAs = values.by === 'own' ? values.statedAs : undefined;
	const changesKind =
		('by' in body && body.by !== values.by) ||
		('statedAs' in body && body.statedAs !== storedStatedAs);
	if (!changesKind) return { ...values, ...body };
	const { key, copiedFrom, name, month, by } = values;
	return { key, copiedFrom, name, month, by, ...body };
}
