import { fail, redirect } from '@sveltejs/kit';
import { farmSettingsFromForm, farmSchema } from '$lib/schemas/farm';
import { toFieldErrors } from '$lib/schemas/issues';
import { requireFarmAccess } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import { farmSettingsOf, updateFarm } from '$lib/server/db/farms';
import type { Actions, PageServerLoad } from './$types';

export const load = (async (event) => {
	const { farm } = await requireFarmAccess(event, event.params.farmId, 'farm:edit');
	return { farm: farmSettingsOf(farm) };
}) satisfies PageServerLoad;

export const actions = {
	default: async (event) => {
		const { user, farm } = await requireFarmAccess(event, event.params.farmId, 'farm:edit');
		const input = farmSettingsFromForm(await event.request.formData());
		const parsed = farmSchema.safeParse(input);
		if (!parsed.success) return fail(400, { values: input, errors: toFieldErrors(parsed.error) });
		await updateFarm(db, farm.id, user.id, parsed.data);
		redirect(303, `/farms/${farm.id}`);
	}
} satisfies Actions;
