import { error, redirect } from '@sveltejs/kit';
import { fail, superValidate } from 'sveltekit-superforms';
import { requireFarmAccess } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import { deletePerson, findPersonById, updatePerson } from '$lib/server/db/people';
import { familyHoursFormFailure, personFormAdapter } from '$lib/server/people';
import type { Actions, PageServerLoad } from './$types';

// `?confirm=delete` asks before deleting: the question is a page state, so it works without JavaScript.
export const load = (async (event) => {
	const { farm } = await requireFarmAccess(event, event.params.farmId, 'farm:edit');
	const person = await personOr404(farm.id, event.params.personId);
	const { id, key: _key, ...values } = person;
	return {
		farm: { id: farm.id, name: farm.name },
		person: { id, name: person.name },
		confirmDelete: event.url.searchParams.get('confirm') === 'delete',
		form: await superValidate(values, personFormAdapter, { errors: false })
	};
}) satisfies PageServerLoad;

export const actions = {
	update: async (event) => {
		const { user, farm } = await requireFarmAccess(event, event.params.farmId, 'farm:edit');
		const person = await personOr404(farm.id, event.params.personId);
		const form = await superValidate(event.request, personFormAdapter);
		if (!form.valid) return fail(400, { form });
		const saved = await updatePerson(db, farm.id, user.id, person.id, {
			...form.data,
			key: person.key
		});
		if ('tooHigh' in saved) return familyHoursFormFailure(form, saved.tooHigh);
		redirect(303, `/farms/${farm.id}/people`);
	},
	delete: async (event) => {
		const { user, farm } = await requireFarmAccess(event, event.params.farmId, 'farm:edit');
		const person = await personOr404(farm.id, event.params.personId);
		await deletePerson(db, farm.id, user.id, person);
		redirect(303, `/farms/${farm.id}/people`);
	}
} satisfies Actions;

async function personOr404(farmId: string, personId: string) {
	const person = await findPersonById(db, farmId, personId);
	if (!person) error(404, 'Person not found.');
	return person;
}
