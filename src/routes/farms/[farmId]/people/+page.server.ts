import { redirect } from '@sveltejs/kit';
import { fail, superValidate } from 'sveltekit-superforms';
import { isFamilyLabour } from '$lib/farm-lists';
import { requireFarmAccess, roleAllows } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import { choosePersonKey, insertPerson, listPeople } from '$lib/server/db/people';
import { familyHoursFormFailure, newPersonValues, personFormAdapter } from '$lib/server/people';
import type { Actions, PageServerLoad } from './$types';

export const load = (async (event) => {
	const { farm, role } = await requireFarmAccess(event, event.params.farmId, 'farm:view');
	const canEdit = roleAllows(role, 'farm:edit');
	const [rows, form] = await Promise.all([
		listPeople(db, farm.id),
		canEdit ? superValidate(newPersonValues, personFormAdapter, { errors: false }) : null
	]);
	const monthly = (family: boolean) =>
		Array.from({ length: 12 }, (_, m) =>
			rows
				.filter((person) => isFamilyLabour(person.role) === family)
				.reduce((sum, person) => sum + person.hoursAvailableByMonth[m], 0)
		);
	return {
		farm: { id: farm.id, name: farm.name },
		canEdit,
		people: rows.map((person) => ({
			id: person.id,
			name: person.name,
			role: person.role,
			hoursAvailableByMonth: person.hoursAvailableByMonth,
			wageUsdPerHour: person.wageUsdPerHour
		})),
		totals: {
			familyHoursByMonth: monthly(true),
			hiredHoursByMonth: monthly(false),
			hasFamily: rows.some((person) => isFamilyLabour(person.role))
		},
		form
	};
}) satisfies PageServerLoad;

export const actions = {
	create: async (event) => {
		const { user, farm } = await requireFarmAccess(event, event.params.farmId, 'farm:edit');
		const form = await superValidate(event.request, personFormAdapter);
		if (!form.valid) return fail(400, { form });
		const key = (await choosePersonKey(db, farm.id, { name: form.data.name }))!;
		const saved = await insertPerson(db, farm.id, user.id, { ...form.data, key });
		if ('tooHigh' in saved) return familyHoursFormFailure(form, saved.tooHigh);
		redirect(303, `/farms/${farm.id}/people?added=${encodeURIComponent(key)}`);
	}
} satisfies Actions;
