import { json } from '@sveltejs/kit';
import { practiceBodySchema } from '$lib/schemas/practices';
import { invalidInput, invalidValue, readJson } from '$lib/server/api';
import { requireFarmAccess } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import { choosePracticeKey, insertPractice, listPractices } from '$lib/server/db/crop-practices';
import {
	checkPractice,
	invalidIssues,
	loadPracticeReferences,
	practiceKeyTakenMessage
} from '$lib/server/practices';
import type { RequestHandler } from './$types';

/** The farm's practices by name: `{ practices: [{ id, key, name, crop, …, operations }] }`. */
export const GET: RequestHandler = async (event) => {
	const { farm } = await requireFarmAccess(event, event.params.farmId, 'farm:view');
	return json({ practices: await listPractices(db, farm.id) });
};

/** Adds a practice (owner or editor): 201 `{ practice }`; its `key` is made from the name when not given. */
export const POST: RequestHandler = async (event) => {
	const { user, farm } = await requireFarmAccess(event, event.params.farmId, 'farm:edit');
	const body = await readJson(event.request);
	if (!body.ok) return body.response;
	const parsed = practiceBodySchema.safeParse(body.body);
	if (!parsed.success) return invalidInput(parsed.error);
	const { key: wanted, ...values } = parsed.data;
	const refs = await loadPracticeReferences(db, farm.id);
	const checked = checkPractice(values, refs);
	if (!checked.ok) return invalidIssues(checked.issues);
	const key = await choosePracticeKey(db, farm.id, { name: values.name, wanted });
	if (key === undefined) return invalidValue('key', practiceKeyTakenMessage(wanted!));
	const practice = { ...checked.practice, key };
	const saved = await insertPractice(db, farm.id, user.id, practice, refs.operationIds);
	return json({ practice: saved }, { status: 201 });
};
