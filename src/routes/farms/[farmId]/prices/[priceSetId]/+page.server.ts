import { error, redirect } from '@sveltejs/kit';
import { fail, setError, superValidate } from 'sveltekit-superforms';
import { formValuesOf, seedRowsIn } from '$lib/schemas/price-sets';
import { requireFarmAccess, roleAllows } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import {
	deletePriceSet,
	findPriceSetById,
	listPlansNeedingYear,
	updatePriceSet
} from '$lib/server/db/price-sets';
import { displayUnits } from '$lib/server/display-units';
import {
	findPriceFormParts,
	formPartsForPage,
	priceFormAdapter,
	priceSetFromForm
} from '$lib/server/price-forms';
import { copyToNextYear, priceSetInUseMessage, yearTakenMessage } from '$lib/server/prices';
import type { Actions, PageServerLoad } from './$types';

// `?confirm=delete` asks before deleting, as on a field's page.
export const load = (async (event) => {
	const { farm, role } = await requireFarmAccess(event, event.params.farmId, 'farm:view');
	const canEdit = roleAllows(role, 'farm:edit');
	const set = await priceSetOr404(farm.id, event.params.priceSetId);
	const parts = await findPriceFormParts(db, farm.id, set);
	const show = displayUnits(farm.unitSystem);
	const confirmDelete = canEdit && event.url.searchParams.get('confirm') === 'delete';
	const [form, plansNeeding] = await Promise.all([
		canEdit
			? superValidate(
					formValuesOf(set, parts.layout, parts.seedIds),
					priceFormAdapter(parts.layout),
					{
						errors: false
					}
				)
			: null,
		confirmDelete ? listPlansNeedingYear(db, farm.id, set.year) : []
	]);
	const cropPrices = new Map(Object.entries(set.cropPricesUsdPerUnit));
	const rates = new Map(Object.entries(set.customRatesUsdPerAcre));
	return {
		farm: { id: farm.id, name: farm.name },
		set: { id: set.id, year: set.year },
		canEdit,
		metric: show.system === 'metric',
		confirmDelete,
		inUse: plansNeeding.length ? priceSetInUseMessage(set.year, plansNeeding) : null,
		// What a reviewer reads: the set in the farm's units, every price named.
		summary: canEdit
			? null
			: {
					crops: parts.crops.flatMap((crop) => {
						const usd = cropPrices.get(crop.id);
						if (usd === undefined) return [];
						return [{ id: crop.id, name: crop.name, ...show.cropPrice(usd, crop) }];
					}),
					inputs: [
						{
							label: 'Nitrogen',
							unit: `${show.unit('mass')} N`,
							value: show.pricePer(set.nitrogenUsdPerLb, 'mass')
						},
						{
							label: 'Diesel',
							unit: show.unit('volume'),
							value: show.pricePer(set.dieselUsdPerGallon, 'volume')
						},
						{ label: 'Labour', unit: 'hour', value: set.labourUsdPerHour },
						{ label: 'Hay', unit: 'bale', value: set.hayUsdPerBale }
					],
					seeds: Object.entries(set.seedPrices)
						.sort(([a], [b]) => a.localeCompare(b))
						.map(([seedId, price]) => ({
							seedId,
							usdPerThousandSeeds: price.usdPerThousandSeeds ?? null,
							perMass: price.usdPerLb === undefined ? null : show.pricePer(price.usdPerLb, 'mass')
						})),
					massUnit: show.unit('mass'),
					areaUnit: show.unit('area'),
					rates: parts.operations.flatMap((op) => {
						const usd = rates.get(op.id);
						return usd === undefined
							? []
							: [{ id: op.id, name: op.name, value: show.pricePer(usd, 'area')! }];
					})
				},
		formParts: canEdit ? formPartsForPage(parts) : null,
		form
	};
}) satisfies PageServerLoad;

export const actions = {
	update: async (event) => {
		const { user, farm } = await requireFarmAccess(event, event.params.farmId, 'farm:edit');
		const stored = await priceSetOr404(farm.id, event.params.priceSetId);
		const posted = await event.request.formData();
		const parts = await findPriceFormParts(db, farm.id, stored, seedRowsIn(posted));
		const form = await superValidate(posted, priceFormAdapter(parts.layout));
		if (!form.valid) return fail(400, { form });
		const set = priceSetFromForm(form, parts);
		if (!set) return fail(400, { form });
		const saved = await updatePriceSet(db, farm.id, user.id, stored.id, set);
		if (!saved.ok) return setError(form, 'year', yearTakenMessage(set.year), { status: 409 });
		redirect(303, `/farms/${farm.id}/prices?saved=${set.year}`);
	},
	copy: async (event) => {
		const { user, farm } = await requireFarmAccess(event, event.params.farmId, 'farm:edit');
		const stored = await priceSetOr404(farm.id, event.params.priceSetId);
		const copied = await copyToNextYear(db, farm.id, user.id, stored);
		if (!copied.ok) return fail(copied.status, { refused: copied.message });
		redirect(303, `/farms/${farm.id}/prices/${copied.priceSet.id}?copied=${stored.year}`);
	},
	delete: async (event) => {
		const { user, farm } = await requireFarmAccess(event, event.params.farmId, 'farm:edit');
		const set = await priceSetOr404(farm.id, event.params.priceSetId);
		const result = await deletePriceSet(db, farm.id, user.id, set);
		if (!result.deleted) {
			return fail(409, { refused: priceSetInUseMessage(set.year, result.planNames) });
		}
		redirect(303, `/farms/${farm.id}/prices`);
	}
} satisfies Actions;

async function priceSetOr404(farmId: string, priceSetId: string) {
	const set = await findPriceSetById(db, farmId, priceSetId);
	if (!set) error(404, 'Price set not found.');
	return set;
}
