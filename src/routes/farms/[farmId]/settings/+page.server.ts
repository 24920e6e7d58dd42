import { fail, redirect } from '@sveltejs/kit';
import { farmSettingsFromForm, farmSchema } from '$lib/schemas/farm';
import { toFieldErrors } from '$lib/schemas/issues';
import { requireFarmAccess } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import { farmSettingsOf, updateFarm } from '$lib/server/db/farms';
import { findFamilyHoursByMonth } from '$lib/server/db/people';
import type { Actions, PageServerLoad } from './$types';

// A farm with family people shows their summed hours read-only: the people page changes them.
export const load = (async (event) => {
	const { farm } = await requireFarmAccess(event, event.params.farmId, 'farm:edit');
	const familyHours = await findFamilyHoursByMonth(db, farm.id);
	return { farm: farmSettingsOf(farm), familyHours };
}) satisfies PageServerLoad;

export const actions = {
	default: async (event) => {
		const { user, farm } = await requireFarmAccess(event, event.params.farmId, 'farm:edit');
		const [formData, familyHours] = await Promise.all([
			event.request.formData(),
			findFamilyHoursByMonth(db, farm.id)
		]);
		const input = farmSettingsFromForm(formData);
		// The form has no hour inputs then; the save keeps the summed hours (updateFarm sees to it).
		if (familyHours) input.labourHoursAvailableByMonth = familyHours;
		const parsed = farmSchema.safeParse(input);
		if (!parsed.success) return fail(400, { values: input, errors: toFieldErrors(parsed.error) });
		await updateFarm(db, farm.id, user.id, parsed.data);
		redirect(303, `/farms/${farm.id}`);
	}
} satisfies Actions;
