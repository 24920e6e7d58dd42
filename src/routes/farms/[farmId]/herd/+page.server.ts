import { redirect } from '@sveltejs/kit';
import { fail, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { herdSchema } from '$lib/schemas/plan-file';
import { requireFarmAccess, roleAllows } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import { deleteHerd, findHerd, saveHerd } from '$lib/server/db/herds';
import type { Actions, PageServerLoad } from './$types';

const adapter = zod4(herdSchema);

// `?confirm=remove` asks before saying the farm keeps no cattle: a page state, so it works without JS.
export const load = (async (event) => {
	const { farm, role } = await requireFarmAccess(event, event.params.farmId, 'farm:view');
	const canEdit = roleAllows(role, 'farm:edit');
	const herd = await findHerd(db, farm.id);
	return {
		farm: { id: farm.id, name: farm.name },
		canEdit,
		herd,
		confirmRemove: canEdit && herd !== null && event.url.searchParams.get('confirm') === 'remove',
		// A new herd starts from the plan file's defaults (intake, bale dry matter, manure N).
		form: canEdit ? await superValidate(herd ?? undefined, adapter, { errors: false }) : null
	};
}) satisfies PageServerLoad;

export const actions = {
	save: async (event) => {
		const { user, farm } = await requireFarmAccess(event, event.params.farmId, 'farm:edit');
		const form = await superValidate(event.request, adapter);
		if (!form.valid) return fail(400, { form });
		await saveHerd(db, farm.id, user.id, form.data);
		redirect(303, `/farms/${farm.id}/herd?saved=1`);
	},
	remove: async (event) => {
		const { user, farm } = await requireFarmAccess(event, event.params.farmId, 'farm:edit');
		await deleteHerd(db, farm.id, user.id);
		redirect(303, `/farms/${farm.id}/herd`);
	}
} satisfies Actions;
