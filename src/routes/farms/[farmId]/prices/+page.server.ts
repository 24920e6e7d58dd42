import { redirect } from '@sveltejs/kit';
import { fail, setError, superValidate } from 'sveltekit-superforms';
import { seedRowsIn, formValuesOf } from '$lib/schemas/price-sets';
import { requireFarmAccess, roleAllows } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import { createPriceSets, listPriceSets } from '$lib/server/db/price-sets';
import { displayUnits } from '$lib/server/display-units';
import {
	findPriceFormParts,
	formPartsForPage,
	priceFormAdapter,
	priceSetFromForm
} from '$lib/server/price-forms';
import { yearTakenMessage } from '$lib/server/prices';
import type { Actions, PageServerLoad } from './$types';

export const load = (async (event) => {
	const { farm, role } = await requireFarmAccess(event, event.params.farmId, 'farm:view');
	const canEdit = roleAllows(role, 'farm:edit');
	const [sets, parts] = await Promise.all([
		listPriceSets(db, farm.id),
		findPriceFormParts(db, farm.id, null)
	]);
	const show = displayUnits(farm.unitSystem);
	// Columns for the crops some year prices, in the crops list's order.
	const pricedCrops = parts.crops.filter((crop) =>
		sets.some((set) => Object.hasOwn(set.cropPricesUsdPerUnit, crop.id))
	);
	const newYear = sets.length ? sets[sets.length - 1].year + 1 : new Date().getFullYear();
	const form = canEdit
		? await superValidate(
				{ ...formValuesOf(null, parts.layout, parts.seedIds), year: newYear },
				priceFormAdapter(parts.layout),
				{ errors: false }
			)
		: null;
	return {
		farm: { id: farm.id, name: farm.name },
		canEdit,
		metric: show.system === 'metric',
		columns: {
			crops: pricedCrops.map((crop) => ({
				id: crop.id,
				name: crop.name,
				unit: show.cropPrice(0, crop).unit
			})),
			nitrogenUnit: `${show.unit('mass')} N`,
			dieselUnit: show.unit('volume')
		},
		years: sets.map((set) => {
			const prices = new Map(Object.entries(set.cropPricesUsdPerUnit));
			return {
				id: set.id,
				year: set.year,
				crops: pricedCrops.map((crop) => {
					const usd = prices.get(crop.id);
					return usd === undefined ? null : show.cropPrice(usd, crop).value;
				}),
				nitrogen: show.pricePer(set.nitrogenUsdPerLb, 'mass'),
				diesel: show.pricePer(set.dieselUsdPerGallon, 'volume'),
				labour: set.labourUsdPerHour,
				hay: set.hayUsdPerBale
			};
		}),
		formParts: canEdit ? formPartsForPage(parts) : null,
		form
	};
}) satisfies PageServerLoad;

export const actions = {
	create: async (event) => {
		const { user, farm } = await requireFarmAccess(event, event.params.farmId, 'farm:edit');
		const posted = await event.request.formData();
		const parts = await findPriceFormParts(db, farm.id, null, seedRowsIn(posted));
		const form = await superValidate(posted, priceFormAdapter(parts.layout));
		if (!form.valid) return fail(400, { form });
		const set = priceSetFromForm(form, parts);
		if (!set) return fail(400, { form });
		const saved = await createPriceSets(db, farm.id, user.id, [set]);
		if (!saved.ok) return setError(form, 'year', yearTakenMessage(set.year), { status: 409 });
		redirect(303, `/farms/${farm.id}/prices?added=${set.year}`);
	}
} satisfies Actions;
