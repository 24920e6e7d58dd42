import { error, json } from '@sveltejs/kit';
import { isJsonObject } from '$lib/schemas/farm-setup';
import { rotationBodySchema } from '$lib/schemas/practices';
import { conflict, invalidInput, invalidValue, readJson } from '$lib/server/api';
import { requireFarmAccess } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import { listPracticeIdsByKey } from '$lib/server/db/crop-practices';
import {
	chooseRotationKey,
	deleteRotation,
	findRotationById,
	updateRotation
} from '$lib/server/db/rotations';
import {
	checkRotation,
	invalidIssues,
	rotationInUseMessage,
	rotationKeyTakenMessage
} from '$lib/server/practices';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = async (event) => {
	const { farm } = await requireFarmAccess(event, event.params.farmId, 'farm:view');
	return json({ rotation: await rotationOr404(farm.id, event.params.rotationId) });
};

/** Changes the name, key or practices the body gives (owner or editor); `practices` replaces all years. */
export const PATCH: RequestHandler = async (event) => {
	const { user, farm } = await requireFarmAccess(event, event.params.farmId, 'farm:edit');
	const stored = await rotationOr404(farm.id, event.params.rotationId);
	const body = await readJson(event.request);
	if (!body.ok) return body.response;
	const values = {
		key: stored.key,
		name: stored.name,
		practices: stored.practices.map((practice) => practice.key)
	};
	const parsed = rotationBodySchema.safeParse(
		isJsonObject(body.body) ? { ...values, ...body.body } : body.body
	);
	if (!parsed.success) return invalidInput(parsed.error);
	const checked = checkRotation(parsed.data, await listPracticeIdsByKey(db, farm.id));
	if (!checked.ok) return invalidIssues(checked.issues);
	const { key: wanted, name } = parsed.data;
	const key = await chooseRotationKey(db, farm.id, { name, wanted, rotationId: stored.id });
	if (key === undefined) return invalidValue('key', rotationKeyTakenMessage(wanted!));
	const rotation = await updateRotation(db, farm.id, user.id, stored.id, {
		key,
		name,
		practiceIds: checked.practiceIds
	});
	return json({ rotation });
};

/** Deletes a rotation (owner or editor); 409 naming the plans whose versions use it. */
export const DELETE: RequestHandler = async (event) => {
	const { user, farm } = await requireFarmAccess(event, event.params.farmId, 'farm:edit');
	const rotation = await rotationOr404(farm.id, event.params.rotationId);
	const result = await deleteRotation(db, farm.id, user.id, rotation);
	if (!result.deleted) {
		return conflict(rotationInUseMessage(rotation.name, result.planNames), {
			plans: result.planNames
		});
	}
	return new Response(null, { status: 204 });
};

async function rotationOr404(farmId: string, rotationId: string) {
	const rotation = await findRotationById(db, farmId, rotationId);
	if (!rotation) error(404, 'Rotation not found.');
	return rotation;
}
