import { error, redirect } from '@sveltejs/kit';
import { fail, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { cropFormSchema } from '$lib/schemas/farm-setup';
import { requireFarmAccess } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import { deleteCrop, findCrop, listPracticesUsingCrop, updateCrop } from '$lib/server/db/crops';
import { builtInCropMessage, cropFromForm, cropInUseMessage } from '$lib/server/farm-setup';
import type { Actions, PageServerLoad } from './$types';

const cropForm = zod4(cropFormSchema);

// `?confirm=delete` asks before deleting, as on a field's page.
export const load = (async (event) => {
	const { farm } = await requireFarmAccess(event, event.params.farmId, 'farm:edit');
	const crop = await ownCropOr404(farm.id, event.params.cropId);
	const confirmDelete = event.url.searchParams.get('confirm') === 'delete';
	const { id: _, builtIn: __, ...values } = crop;
	const [form, practicesUsing] = await Promise.all([
		superValidate(values, cropForm, { errors: false }),
		confirmDelete ? listPracticesUsingCrop(db, farm.id, crop.id) : []
	]);
	return {
		farm: { id: farm.id, name: farm.name },
		crop: { id: crop.id, name: crop.name },
		confirmDelete,
		inUse: practicesUsing.length ? cropInUseMessage(crop.name, practicesUsing) : null,
		form
	};
}) satisfies PageServerLoad;

export const actions = {
	update: async (event) => {
		const { user, farm } = await requireFarmAccess(event, event.params.farmId, 'farm:edit');
		const stored = await ownCropOr404(farm.id, event.params.cropId);
		const form = await superValidate(event.request, cropForm);
		if (!form.valid) return fail(400, { form });
		const crop = cropFromForm(form, stored.id);
		if (!crop) return fail(400, { form });
		await updateCrop(db, farm.id, user.id, crop);
		redirect(303, `/farms/${farm.id}/crops`);
	},
	delete: async (event) => {
		const { user, farm } = await requireFarmAccess(event, event.params.farmId, 'farm:edit');
		const crop = await ownCropOr404(farm.id, event.params.cropId);
		const result = await deleteCrop(db, farm.id, user.id, crop);
		if (!result.deleted) {
			return fail(409, { refused: cropInUseMessage(crop.name, result.practiceNames) });
		}
		redirect(303, `/farms/${farm.id}/crops`);
	}
} satisfies Actions;

/** One of the farm's own crops; a built-in one is refused (it cannot change), an unknown one is 404. */
async function ownCropOr404(farmId: string, cropId: string) {
	const crop = await findCrop(db, farmId, cropId);
	if (!crop) error(404, 'Crop not found.');
	if (crop.builtIn) error(409, builtInCropMessage(crop.name));
	return crop;
}
