import { redirect } from '@sveltejs/kit';
import { fail, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { checkRotation } from '$lib/engine/rotation-checks';
import { maxRotationYears, rotationFormSchema } from '$lib/schemas/practices';
import { requireFarmAccess, roleAllows } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import { listPracticeIdsByKey } from '$lib/server/db/crop-practices';
import { chooseRotationKey, insertRotation, listRotations } from '$lib/server/db/rotations';
import { loadRotationChoices, rotationFromFormOrErrors, rotationYear } from '$lib/server/practices';
import type { Actions, PageServerLoad } from './$types';

const rotationForm = zod4(rotationFormSchema);

export const load = (async (event) => {
	const { farm, role } = await requireFarmAccess(event, event.params.farmId, 'farm:view');
	const canEdit = roleAllows(role, 'farm:edit');
	const [rotations, { practices, cropById, choices }, form] = await Promise.all([
		listRotations(db, farm.id),
		loadRotationChoices(db, farm.id),
		canEdit
			? superValidate({ practice: Array(maxRotationYears).fill('') }, rotationForm, {
					errors: false
				})
			: null
	]);
	const practiceById = new Map(practices.map((practice) => [practice.id, practice]));
	return {
		farm: { id: farm.id, name: farm.name },
		canEdit,
		rotations: rotations.map((rotation) => {
			const years = rotation.practices.map(({ id }) => {
				const practice = practiceById.get(id)!;
				const crop = cropById.get(practice.crop);
				return {
					practice,
					crop: {
						id: practice.crop,
						name: crop?.name ?? practice.crop,
						legume: crop?.legume ?? false,
						soldBy: crop?.soldBy ?? 'bu'
					}
				};
			});
			return {
				id: rotation.id,
				name: rotation.name,
				years: years.map(({ practice }) => rotationYear(practice, cropById)),
				warnings: checkRotation(
					years.map(({ practice, crop }) => ({
						practiceName: practice.name,
						crop,
						nitrogenAppliedLbPerAcre: practice.nitrogen.appliedLbPerAcre,
						nitrogenCreditToNextCropLbPerAcre: practice.nitrogenCreditToNextCropLbPerAcre,
						coverMix: practice.coverMix
					}))
				)
			};
		}),
		choices,
		form
	};
}) satisfies PageServerLoad;

export const actions = {
	create: async (event) => {
		const { user, farm } = await requireFarmAccess(event, event.params.farmId, 'farm:edit');
		const form = await superValidate(event.request, rotationForm);
		if (!form.valid) return fail(400, { form });
		const practiceIds = rotationFromFormOrErrors(form, await listPracticeIdsByKey(db, farm.id));
		if (!practiceIds) return fail(400, { form });
		const key = (await chooseRotationKey(db, farm.id, { name: form.data.name }))!;
		await insertRotation(db, farm.id, user.id, { key, name: form.data.name, practiceIds });
		redirect(303, `/farms/${farm.id}/rotations?added=${encodeURIComponent(key)}`);
	}
} satisfies Actions;
