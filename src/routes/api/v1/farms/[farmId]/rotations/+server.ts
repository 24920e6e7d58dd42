import { json } from '@sveltejs/kit';
import { rotationBodySchema } from '$lib/schemas/practices';
import { invalidInput, invalidValue, readJson } from '$lib/server/api';
import { requireFarmAccess } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import { listPracticeIdsByKey } from '$lib/server/db/crop-practices';
import { chooseRotationKey, insertRotation, listRotations } from '$lib/server/db/rotations';
import { checkRotation, invalidIssues, rotationKeyTakenMessage } from '$lib/server/practices';
import type { RequestHandler } from './$types';

/** The farm's rotations by name: `{ rotations: [{ id, key, name, practices: [{ key, id }] }] }`. */
export const GET: RequestHandler = async (event) => {
	const { farm } = await requireFarmAccess(event, event.params.farmId, 'farm:view');
	return json({ rotations: await listRotations(db, farm.id) });
};

/** Adds a rotation of 1–8 practices by key (owner or editor): 201 `{ rotation }`. */
export const POST: RequestHandler = async (event) => {
	const { user, farm } = await requireFarmAccess(event, event.params.farmId, 'farm:edit');
	const body = await readJson(event.request);
	if (!body.ok) return body.response;
	const parsed = rotationBodySchema.safeParse(body.body);
	if (!parsed.success) return invalidInput(parsed.error);
	const checked = checkRotation(parsed.data, await listPracticeIdsByKey(db, farm.id));
	if (!checked.ok) return invalidIssues(checked.issues);
	const { key: wanted, name } = parsed.data;
	const key = await chooseRotationKey(db, farm.id, { name, wanted });
	if (key === undefined) return invalidValue('key', rotationKeyTakenMessage(wanted!));
	const rotation = await insertRotation(db, farm.id, user.id, {
		key,
		name,
		practiceIds: checked.practiceIds
	});
	return json({ rotation }, { status: 201 });
};
