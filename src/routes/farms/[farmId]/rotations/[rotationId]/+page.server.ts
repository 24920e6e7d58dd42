import { error, redirect } from '@sveltejs/kit';
import { fail, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { maxRotationYears, rotationFormSchema } from '$lib/schemas/practices';
import { requireFarmAccess } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import { listPracticeIdsByKey } from '$lib/server/db/crop-practices';
import {
	deleteRotation,
	findRotationById,
	listPlansUsingRotation,
	updateRotation
} from '$lib/server/db/rotations';
import {
	loadRotationChoices,
	rotationFromFormOrErrors,
	rotationInUseMessage
} from '$lib/server/practices';
import type { Actions, PageServerLoad } from './$types';

const rotationForm = zod4(rotationFormSchema);

// `?confirm=delete` asks before deleting, as on a field's page.
export const load = (async (event) => {
	const { farm } = await requireFarmAccess(event, event.params.farmId, 'farm:edit');
	const rotation = await rotationOr404(farm.id, event.params.rotationId);
	const confirmDelete = event.url.searchParams.get('confirm') === 'delete';
	const practice = Array.from(
		{ length: maxRotationYears },
		(_, i) => rotation.practices[i]?.key ?? ''
	);
	const [form, { choices }, plansUsing] = await Promise.all([
		superValidate({ name: rotation.name, practice }, rotationForm, { errors: false }),
		loadRotationChoices(db, farm.id),
		confirmDelete ? listPlansUsingRotation(db, rotation.id) : []
	]);
	return {
		farm: { id: farm.id, name: farm.name },
		rotation: { id: rotation.id, name: rotation.name },
		choices,
		confirmDelete,
		inUse: plansUsing.length ? rotationInUseMessage(rotation.name, plansUsing) : null,
		form
	};
}) satisfies PageServerLoad;

export const actions = {
	update: async (event) => {
		const { user, farm } = await requireFarmAccess(event, event.params.farmId, 'farm:edit');
		const rotation = await rotationOr404(farm.id, event.params.rotationId);
		const form = await superValidate(event.request, rotationForm);
		if (!form.valid) return fail(400, { form });
		const practiceIds = rotationFromFormOrErrors(form, await listPracticeIdsByKey(db, farm.id));
		if (!practiceIds) return fail(400, { form });
		await updateRotation(db, farm.id, user.id, rotation.id, {
			key: rotation.key,
			name: form.data.name,
			practiceIds
		});
		redirect(303, `/farms/${farm.id}/rotations?added=${encodeURIComponent(rotation.key)}`);
	},
	delete: async (event) => {
		const { user, farm } = await requireFarmAccess(event, event.params.farmId, 'farm:edit');
		const rotation = await rotationOr404(farm.id, event.params.rotationId);
		const result = await deleteRotation(db, farm.id, user.id, rotation);
		if (!result.deleted) {
			return fail(409, { refused: rotationInUseMessage(rotation.name, result.planNames) });
		}
		redirect(303, `/farms/${farm.id}/rotations`);
	}
} satisfies Actions;

async function rotationOr404(farmId: string, rotationId: string) {
	const rotation = await findRotationById(db, farmId, rotationId);
	if (!rotation) error(404, 'Rotation not found.');
	return rotation;
}
