import { error, json } from '@sveltejs/kit';
import { isJsonObject } from '$lib/schemas/farm-setup';
import { personBodySchema } from '$lib/schemas/people';
import { invalidInput, invalidValue, readJson } from '$lib/server/api';
import { requireFarmAccess } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import { choosePersonKey, deletePerson, findPersonById, updatePerson } from '$lib/server/db/people';
import { familyHoursRefusal, personKeyTakenMessage } from '$lib/server/people';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = async (event) => {
	const { farm } = await requireFarmAccess(event, event.params.farmId, 'farm:view');
	return json({ person: await personOr404(farm.id, event.params.personId) });
};

/** Changes the values the body gives (owner or editor): the stored person with the body over it must be valid. */
export const PATCH: RequestHandler = async (event) => {
	const { user, farm } = await requireFarmAccess(event, event.params.farmId, 'farm:edit');
	const stored = await personOr404(farm.id, event.params.personId);
	const body = await readJson(event.request);
	if (!body.ok) return body.response;
	const { id, ...values } = stored;
	const input = isJsonObject(body.body) ? { ...values, ...body.body } : body.body;
	const parsed = personBodySchema.safeParse(input);
	if (!parsed.success) return invalidInput(parsed.error);
	const person = { ...parsed.data, key: parsed.data.key ?? stored.key };
	const key = await choosePersonKey(db, farm.id, {
		name: person.name,
		wanted: person.key,
		personId: id
	});
	if (key === undefined) return invalidValue('key', personKeyTakenMessage(person.key));
	const saved = await updatePerson(db, farm.id, user.id, id, person);
	if ('tooHigh' in saved) return familyHoursRefusal(saved.tooHigh);
	return json({ person: saved.person });
};

/** Deletes a person (owner or editor); the farm's labour hours are the family left, summed. */
export const DELETE: RequestHandler = async (event) => {
	const { user, farm } = await requireFarmAccess(event, event.params.farmId, 'farm:edit');
	const person = await personOr404(farm.id, event.params.personId);
	await deletePerson(db, farm.id, user.id, person);
	return new Response(null, { status: 204 });
};

async function personOr404(farmId: string, personId: string) {
	const person = await findPersonById(db, farmId, personId);
	if (!person) error(404, 'Person not found.');
	return person;
}
