import { redirect } from '@sveltejs/kit';
import { fail, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { cropFormSchema } from '$lib/schemas/farm-setup';
import { requireFarmAccess, roleAllows } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import { chooseCropId, insertCrop, listCropsWithBuiltIns } from '$lib/server/db/crops';
import { cropFromForm } from '$lib/server/farm-setup';
import type { Actions, PageServerLoad } from './$types';

const cropForm = zod4(cropFormSchema);

export const load = (async (event) => {
	const { farm, role } = await requireFarmAccess(event, event.params.farmId, 'farm:view');
	const canEdit = roleAllows(role, 'farm:edit');
	const [crops, form] = await Promise.all([
		listCropsWithBuiltIns(db, farm.id),
		canEdit ? superValidate(cropForm) : null
	]);
	return { farm: { id: farm.id, name: farm.name }, canEdit, crops, form };
}) satisfies PageServerLoad;

export const actions = {
	create: async (event) => {
		const { user, farm } = await requireFarmAccess(event, event.params.farmId, 'farm:edit');
		const form = await superValidate(event.request, cropForm);
		if (!form.valid) return fail(400, { form });
		const id = (await chooseCropId(db, farm.id, { name: form.data.name }))!;
		const crop = cropFromForm(form, id);
		if (!crop) return fail(400, { form });
		await insertCrop(db, farm.id, user.id, crop);
		redirect(303, `/farms/${farm.id}/crops?added=${encodeURIComponent(id)}`);
	}
} satisfies Actions;
