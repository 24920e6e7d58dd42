import { error, redirect } from '@sveltejs/kit';
import { fail, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { requireFarmAccess } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import {
	deleteField,
	findFieldById,
	listPlansUsingField,
	updateField
} from '$lib/server/db/fields';
import { displayUnits } from '$lib/server/display-units';
import {
	acresFromShownArea,
	cashRentFromShown,
	fieldFormRanges,
	fieldFormSchemas,
	fieldInUseMessage,
	shownArea,
	shownCashRent
} from '$lib/server/farm-setup';
import type { Actions, PageServerLoad } from './$types';

// `?confirm=delete` asks before deleting: the question is a page state, so it works without JavaScript.
export const load = (async (event) => {
	const { farm } = await requireFarmAccess(event, event.params.farmId, 'farm:edit');
	const field = await fieldOr404(farm.id, event.params.fieldId);
	const show = displayUnits(farm.unitSystem);
	const confirmDelete = event.url.searchParams.get('confirm') === 'delete';
	const [form, plansUsing] = await Promise.all([
		superValidate(
			{
				name: field.name,
				area: shownArea(field.acres, farm.unitSystem),
				productivityIndex: field.productivityIndex,
				priorCrop: field.priorCrop,
				tenure: field.tenure,
				cashRent: shownCashRent(field.cashRentUsdPerAcre, farm.unitSystem),
				notes: field.notes
			},
			zod4(fieldFormSchemas.get(farm.unitSystem)!),
			{ errors: false }
		),
		confirmDelete ? listPlansUsingField(db, field.id) : []
	]);
	return {
		farm: { id: farm.id, name: farm.name },
		field: { id: field.id, name: field.name },
		areaUnit: show.unit('area'),
		ranges: fieldFormRanges(farm.unitSystem),
		confirmDelete,
		inUse: plansUsing.length ? fieldInUseMessage(field.name, plansUsing) : null,
		form
	};
}) satisfies PageServerLoad;

export const actions = {
	update: async (event) => {
		const { user, farm } = await requireFarmAccess(event, event.params.farmId, 'farm:edit');
		const field = await fieldOr404(farm.id, event.params.fieldId);
		const form = await superValidate(event.request, zod4(fieldFormSchemas.get(farm.unitSystem)!));
		if (!form.valid) return fail(400, { form });
		const { area, cashRent, ...values } = form.data;
		// Values left as shown keep their stored figures (hectares to the hundredth do not round-trip).
		const unchanged = area === shownArea(field.acres, farm.unitSystem);
		const acres = unchanged ? field.acres : acresFromShownArea(area, farm.unitSystem);
		const rentUnchanged = cashRent === shownCashRent(field.cashRentUsdPerAcre, farm.unitSystem);
		await updateField(db, farm.id, user.id, field.id, {
			...values,
			acres,
			cashRentUsdPerAcre: rentUnchanged
				? field.cashRentUsdPerAcre
				: cashRentFromShown(cashRent, farm.unitSystem),
			key: field.key,
			priorCropNitrogenCreditLbPerAcre: field.priorCropNitrogenCreditLbPerAcre
		});
		redirect(303, `/farms/${farm.id}/fields`);
	},
	delete: async (event) => {
		const { user, farm } = await requireFarmAccess(event, event.params.farmId, 'farm:edit');
		const field = await fieldOr404(farm.id, event.params.fieldId);
		const result = await deleteField(db, farm.id, user.id, field);
		if (!result.deleted) {
			return fail(409, { refused: fieldInUseMessage(field.name, result.planNames) });
		}
		redirect(303, `/farms/${farm.id}/fields`);
	}
} satisfies Actions;

async function fieldOr404(farmId: string, fieldId: string) {
	const field = await findFieldById(db, farmId, fieldId);
	if (!field) error(404, 'Field not found.');
	return field;
}
