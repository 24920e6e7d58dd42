import { cropSchema } from '$lib/schemas/plan-file';
import { requireFarmAccess } from '$lib/server/auth/access';
import { displayUnits } from '$lib/server/display-units';
import { getFarmData } from '$lib/server/db/farm-data';
import type { PageServerLoad } from './$types';

export const load = (async (event) => {
	const { farm } = await requireFarmAccess(event, event.params.farmId, 'farm:view');
	const data = await getFarmData(farm.id);
	const show = displayUnits(farm.unitSystem);
	const herd = data.herd;
	return {
		farm: { id: farm.id, name: farm.name },
		units: {
			system: farm.unitSystem,
			area: show.unit('area'),
			mass: show.unit('mass'),
			speed: show.unit('speed'),
			length: show.unit('length'),
			volume: show.unit('volume')
		},
		fields: data.fields.map((field) => ({ ...field, area: show.amount(field.acres, 'area') })),
		herd: herd && {
			...herd,
			averageWeight: show.amount(herd.averageWeightLb, 'mass'),
			intakeDmPerAuDay: show.amount(herd.intakeLbDmPerAuDay, 'mass'),
			baleWeight: show.amount(herd.baleWeightLb, 'mass')
		},
		priceSets: data.priceSets.map((set) => ({
			...set,
			nitrogenUsd: show.pricePer(set.nitrogenUsdPerLb, 'mass'),
			dieselUsd: show.pricePer(set.dieselUsdPerGallon, 'volume'),
			cropPrices: set.items
				.filter((item) => item.kind === 'crop')
				.map((item) => ({
					crop: item.key,
					...show.cropPrice(item.priceUsd, cropSchema.parse(item.key))
				}))
		})),
		operations: data.operations.map((op) => ({
			...op,
			speed: show.amount(op.speedMph, 'speed'),
			width: show.amount(op.widthFt, 'length'),
			repairsUsd: show.pricePer(op.repairsUsdPerAcre, 'area')
		})),
		practices: data.practices.map((practice) => ({
			...practice,
			yieldGoal: show.yieldPerArea(practice.yieldGoalPerAcre, practice.crop),
			chemicalsUsd: show.pricePer(practice.chemicalsUsdPerAcre, 'area'),
			otherFertiliserUsd: show.pricePer(practice.otherFertiliserUsdPerAcre, 'area')
		})),
		rotations: data.rotations,
		plans: data.plans
	};
}) satisfies PageServerLoad;
