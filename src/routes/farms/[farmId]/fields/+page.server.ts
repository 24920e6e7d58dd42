import { redirect } from '@sveltejs/kit';
import { fail, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { z } from 'zod';
import { requireFarmAccess, roleAllows } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import { chooseFieldKey, insertField, listFields } from '$lib/server/db/fields';
import { displayUnits } from '$lib/server/display-units';
import {
	acresFromShownArea,
	cashRentFromShown,
	fieldFormRanges,
	fieldFormSchemas
} from '$lib/server/farm-setup';
import { tenureLabels } from '$lib/farm-lists';
import type { Actions, PageServerLoad } from './$types';

const sortColumns = ['name', 'area', 'productivityIndex', 'priorCrop', 'tenure'] as const;
const viewSchema = z.object({
	sort: z.enum(sortColumns).catch('name'),
	dir: z.enum(['asc', 'desc']).catch('asc')
});

// The table's order is view state in the URL (?sort=area&dir=desc), so it works without JavaScript.
export const load = (async (event) => {
	const { farm, role } = await requireFarmAccess(event, event.params.farmId, 'farm:view');
	const canEdit = roleAllows(role, 'farm:edit');
	const view = viewSchema.parse(Object.fromEntries(event.url.searchParams));
	const [rows, form] = await Promise.all([
		listFields(db, farm.id),
		canEdit ? superValidate(zod4(fieldFormSchemas.get(farm.unitSystem)!)) : null
	]);
	const show = displayUnits(farm.unitSystem);
	const fields = rows.map((field) => ({
		id: field.id,
		name: field.name,
		area: show.amount(field.acres, 'area')!,
		productivityIndex: field.productivityIndex,
		priorCrop: field.priorCrop,
		tenure: tenureLabels[field.tenure],
		cashRent:
			field.tenure === 'cash-rented' ? show.pricePer(field.cashRentUsdPerAcre, 'area')! : null,
		notes: field.notes
	}));
	const totalAcres = rows.reduce((sum, field) => sum + field.acres, 0);
	const rented = rows.filter((field) => field.tenure === 'cash-rented');
	const rentedAcres = rented.reduce((sum, field) => sum + field.acres, 0);
	const rentUsd = rented.reduce((sum, field) => sum + field.acres * field.cashRentUsdPerAcre, 0);
	const weightedIndex = rows.reduce((sum, f) => sum + f.acres * f.productivityIndex, 0);
	return {
		farm: { id: farm.id, name: farm.name },
		canEdit,
		areaUnit: show.unit('area'),
		ranges: fieldFormRanges(farm.unitSystem),
		view,
		fields: sortFields(fields, view),
		totals: {
			count: rows.length,
			area: show.amount(totalAcres, 'area')!,
			ownedArea: show.amount(totalAcres - rentedAcres, 'area')!,
			rentedArea: show.amount(rentedAcres, 'area')!,
			rentUsdPerYear: rentUsd,
			// Weighted by area, so a big field counts for more than a small one.
			productivityIndex: totalAcres > 0 ? weightedIndex / totalAcres : null
		},
		form
	};
}) satisfies PageServerLoad;

export const actions = {
	create: async (event) => {
		const { user, farm } = await requireFarmAccess(event, event.params.farmId, 'farm:edit');
		const form = await superValidate(event.request, zod4(fieldFormSchemas.get(farm.unitSystem)!));
		if (!form.valid) return fail(400, { form });
		const { area, cashRent, ...values } = form.data;
		const key = (await chooseFieldKey(db, farm.id, { name: values.name }))!;
		const acres = acresFromShownArea(area, farm.unitSystem);
		await insertField(db, farm.id, user.id, {
			...values,
			acres,
			cashRentUsdPerAcre: cashRentFromShown(cashRent, farm.unitSystem),
			key,
			priorCropNitrogenCreditLbPerAcre: 0
		});
		redirect(303, `/farms/${farm.id}/fields?added=${encodeURIComponent(key)}`);
	}
} satisfies Actions;

type ShownField = {
	name: string;
	area: number;
	productivityIndex: number;
	priorCrop: string;
	tenure: string;
};

function sortFields<T extends ShownField>(fields: T[], view: z.output<typeof viewSchema>): T[] {
	const sign = view.dir === 'asc' ? 1 : -1;
	const compare = (a: T, b: T) => {
		const x = a[view.sort];
		const y = b[view.sort];
		const order =
			typeof x === 'number' && typeof y === 'number' ? x - y : String(x).localeCompare(String(y));
		return order * sign || a.name.localeCompare(b.name);
	};
	return [...fields].sort(compare);
}
