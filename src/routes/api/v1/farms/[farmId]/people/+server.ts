import { json } from '@sveltejs/kit';
import { personBodySchema } from '$lib/schemas/people';
import { invalidInput, invalidValue, readJson } from '$lib/server/api';
import { requireFarmAccess } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import { choosePersonKey, insertPerson, listPeople } from '$lib/server/db/people';
import { familyHoursRefusal, personKeyTakenMessage } from '$lib/server/people';
import type { RequestHandler } from './$types';

/** The farm's people, operator first and hired help last: `{ people: [{ id, key, name, role, … }] }`. */
export const GET: RequestHandler = async (event) => {
	const { farm } = await requireFarmAccess(event, event.params.farmId, 'farm:view');
	return json({ people: await listPeople(db, farm.id) });
};

/** Adds a person (owner or editor): 201 `{ person }`; the farm's labour hours become the family's summed. */
export const POST: RequestHandler = async (event) => {
	const { user, farm } = await requireFarmAccess(event, event.params.farmId, 'farm:edit');
	const body = await readJson(event.request);
	if (!body.ok) return body.response;
	const parsed = personBodySchema.safeParse(body.body);
	if (!parsed.success) return invalidInput(parsed.error);
	const { key: wanted, ...person } = parsed.data;
	const key = await choosePersonKey(db, farm.id, { name: person.name, wanted });
	if (key === undefined) return invalidValue('key', personKeyTakenMessage(wanted!));
	const saved = await insertPerson(db, farm.id, user.id, { ...person, key });
	if ('tooHigh' in saved) return familyHoursRefusal(saved.tooHigh);
	return json({ person: saved.person }, { status: 201 });
};
