import { error, json } from '@sveltejs/kit';
import { isJsonObject } from '$lib/schemas/farm-setup';
import { practiceBodySchema } from '$lib/schemas/practices';
import { conflict, invalidInput, invalidValue, readJson } from '$lib/server/api';
import { requireFarmAccess } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import {
	choosePracticeKey,
	deletePractice,
	findPracticeById,
	updatePractice
} from '$lib/server/db/crop-practices';
import {
	checkPractice,
	invalidIssues,
	loadPracticeReferences,
	practiceInUseMessage,
	practiceKeyTakenMessage
} from '$lib/server/practices';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = async (event) => {
	const { farm } = await requireFarmAccess(event, event.params.farmId, 'farm:view');
	return json({ practice: await practiceOr404(farm.id, event.params.practiceId) });
};

/**
 * Changes the values the body gives (owner or editor): the stored practice with the body over it must
 * be valid. A body's `operations`, `seed`, `nitrogen`, `coverMix` or `residueGrazing` replaces the stored one whole.
 */
export const PATCH: RequestHandler = async (event) => {
	const { user, farm } = await requireFarmAccess(event, event.params.farmId, 'farm:edit');
	const stored = await practiceOr404(farm.id, event.params.practiceId);
	const body = await readJson(event.request);
	if (!body.ok) return body.response;
	const { id, ...values } = stored;
	const parsed = practiceBodySchema.safeParse(
		isJsonObject(body.body) ? { ...values, ...body.body } : body.body
	);
	if (!parsed.success) return invalidInput(parsed.error);
	const { key: wanted, ...merged } = parsed.data;
	const refs = await loadPracticeReferences(db, farm.id);
	const checked = checkPractice(merged, refs);
	if (!checked.ok) return invalidIssues(checked.issues);
	const key = await choosePracticeKey(db, farm.id, {
		name: merged.name,
		wanted: wanted ?? stored.key,
		practiceId: id
	});
	if (key === undefined) return invalidValue('key', practiceKeyTakenMessage(wanted!));
	const practice = { ...checked.practice, key };
	return json({
		practice: await updatePractice(db, farm.id, user.id, id, practice, refs.operationIds)
	});
};

/** Deletes a practice (owner or editor); 409 naming the rotations that grow it. */
export const DELETE: RequestHandler = async (event) => {
	const { user, farm } = await requireFarmAccess(event, event.params.farmId, 'farm:edit');
	const practice = await practiceOr404(farm.id, event.params.practiceId);
	const result = await deletePractice(db, farm.id, user.id, practice);
	if (!result.deleted) {
		return conflict(practiceInUseMessage(practice.name, result.rotationNames), {
			rotations: result.rotationNames
		});
	}
	return new Response(null, { status: 204 });
};

async function practiceOr404(farmId: string, practiceId: string) {
	const practice = await findPracticeById(db, farmId, practiceId);
	if (!practice) error(404, 'Practice not found.');
	return practice;
}
