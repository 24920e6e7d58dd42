import { error, redirect } from '@sveltejs/kit';
import { fail, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { practiceFormSchema, practiceFormValues } from '$lib/schemas/practices';
import { requireFarmAccess, roleAllows } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import {
	deletePractice,
	findPracticeById,
	listRotationsUsingPractice,
	updatePractice
} from '$lib/server/db/crop-practices';
import {
	loadPracticeFormChoices,
	loadPracticeReferences,
	practiceFromFormOrErrors,
	practiceInUseMessage
} from '$lib/server/practices';
import type { Actions, PageServerLoad } from './$types';

const practiceForm = zod4(practiceFormSchema);

// A reviewer reads the practice; an owner or editor gets the form. `?confirm=delete` asks before deleting.
export const load = (async (event) => {
	const { farm, role } = await requireFarmAccess(event, event.params.farmId, 'farm:view');
	const practice = await practiceOr404(farm.id, event.params.practiceId);
	const canEdit = roleAllows(role, 'farm:edit');
	const confirmDelete = canEdit && event.url.searchParams.get('confirm') === 'delete';
	const { id, key: _, ...values } = practice;
	const [form, choices, rotationsUsing] = await Promise.all([
		canEdit ? superValidate(practiceFormValues(values, 2), practiceForm, { errors: false }) : null,
		loadPracticeFormChoices(db, farm.id),
		confirmDelete ? listRotationsUsingPractice(db, id) : []
	]);
	return {
		farm: { id: farm.id, name: farm.name },
		practice: { id, name: practice.name },
		// A reviewer sees the practice read-only: the form's values, named.
		shown: canEdit ? null : practiceFormValues(values, 0),
		...choices,
		confirmDelete,
		inUse: rotationsUsing.length ? practiceInUseMessage(practice.name, rotationsUsing) : null,
		form
	};
}) satisfies PageServerLoad;

export const actions = {
	update: async (event) => {
		const { user, farm } = await requireFarmAccess(event, event.params.farmId, 'farm:edit');
		const stored = await practiceOr404(farm.id, event.params.practiceId);
		const form = await superValidate(event.request, practiceForm);
		if (!form.valid) return fail(400, { form });
		const refs = await loadPracticeReferences(db, farm.id);
		const practice = practiceFromFormOrErrors(form, refs);
		if (!practice) return fail(400, { form });
		const key = stored.key;
		await updatePractice(db, farm.id, user.id, stored.id, { ...practice, key }, refs.operationIds);
		redirect(303, `/farms/${farm.id}/practices?added=${encodeURIComponent(key)}`);
	},
	delete: async (event) => {
		const { user, farm } = await requireFarmAccess(event, event.params.farmId, 'farm:edit');
		const practice = await practiceOr404(farm.id, event.params.practiceId);
		const result = await deletePractice(db, farm.id, user.id, practice);
		if (!result.deleted) {
			return fail(409, { refused: practiceInUseMessage(practice.name, result.rotationNames) });
		}
		redirect(303, `/farms/${farm.id}/practices`);
	}
} satisfies Actions;

async function practiceOr404(farmId: string, practiceId: string) {
	const practice = await findPracticeById(db, farmId, practiceId);
	if (!practice) error(404, 'Practice not found.');
	return practice;
}
