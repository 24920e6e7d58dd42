import { redirect } from '@sveltejs/kit';
import { fail, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { practiceFormSchema } from '$lib/schemas/practices';
import { requireFarmAccess } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import { choosePracticeKey, insertPractice } from '$lib/server/db/crop-practices';
import {
	loadPracticeFormChoices,
	loadPracticeReferences,
	practiceFromFormOrErrors
} from '$lib/server/practices';

import type { Actions, PageServerLoad } from './$types';

const practiceForm = zod4(practiceFormSchema);
// Rows a browser without JavaScript can fill in: operations, and cover species.
const blankRows = 4;

export const load = (async (event) => {
	const { farm } = await requireFarmAccess(event, event.params.farmId, 'farm:edit');
	const [form, choices] = await Promise.all([
		superValidate(
			{
				crop: 'corn',
				operationKey: Array(blankRows).fill(''),
				operationMonth: Array(blankRows).fill(0),
				operationPasses: Array(blankRows).fill(1),
				coverSeedId: Array(blankRows).fill(''),
				coverLbPerAcre: Array(blankRows).fill(null)
			},
			practiceForm,
			{ errors: false }
		),
		loadPracticeFormChoices(db, farm.id)
	]);
	return { farm: { id: farm.id, name: farm.name }, ...choices, form };
}) satisfies PageServerLoad;

export const actions = {
	create: async (event) => {
		const { user, farm } = await requireFarmAccess(event, event.params.farmId, 'farm:edit');
		const form = await superValidate(event.request, practiceForm);
		if (!form.valid) return fail(400, { form });
		const refs = await loadPracticeReferences(db, farm.id);
		const practice = practiceFromFormOrErrors(form, refs);
		if (!practice) return fail(400, { form });
		const key = (await choosePracticeKey(db, farm.id, { name: practice.name }))!;
		await insertPractice(db, farm.id, user.id, { ...practice, key }, refs.operationIds);
		redirect(303, `/farms/${farm.id}/practices?added=${encodeURIComponent(key)}`);
	}
} satisfies Actions;
