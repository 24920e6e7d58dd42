import { fail, redirect } from '@sveltejs/kit';
import { farmSettingsFromForm, farmSchema } from '$lib/schemas/farm';
import { toFieldErrors } from '$lib/schemas/issues';
import { requireUser } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import { createFarm, listFarmsForUser } from '$lib/server/db/farms';
import { listPlansForReviewer } from '$lib/server/reviewer-home';
import type { Actions, PageServerLoad } from './$types';

export const load = (async (event) => {
	const user = requireUser(event);
	const farms = await listFarmsForUser(db, user.id);
	// A reviewer (a lender, an advisor) lands here: the plans of the farms they review, theirs to see first.
	const reviewed = farms.filter((farm) => farm.role === 'reviewer').map((farm) => farm.id);
	return { farms, toReview: await listPlansForReviewer(db, reviewed) };
}) satisfies PageServerLoad;

export const actions = {
	create: async (event) => {
		const user = requireUser(event);
		const input = farmSettingsFromForm(await event.request.formData());
		const parsed = farmSchema.safeParse(input);
		if (!parsed.success) return fail(400, { values: input, errors: toFieldErrors(parsed.error) });
		const farm = await createFarm(db, user.id, parsed.data);
		redirect(303, `/farms/${farm.id}`);
	}
} satisfies Actions;
