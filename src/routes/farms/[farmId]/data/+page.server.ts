import { requireFarmAccess } from '$lib/server/auth/access';
import { displayUnits } from '$lib/server/display-units';
import { db } from '$lib/server/db';
import { listCropPracticesByFarm } from '$lib/server/db/crop-practices';
import { listCropsByFarm } from '$lib/server/db/crops';
import { listFieldOperationsByFarm } from '$lib/server/db/field-operations';
import { listFieldsByFarm } from '$lib/server/db/fields';
import { findHerdByFarm } from '$lib/server/db/herds';
import { listPlansByFarm } from '$lib/server/db/plans';
import { listPriceSetsByFarm } from '$lib/server/db/price-sets';
import { listRotationsByFarm } from '$lib/server/db/rotations';
import type { PageServerLoad } from './$types';

// Amounts and prices are in the farm's shown units: `…PerArea` is $/ac or $/ha as `units.area` says.
export const load = (async (event) => {
	const { farm } = await requireFarmAccess(event, event.params.farmId, 'farm:view');
	const [crops, fields, herd, priceSets, operations, practices, rotations, plans] =
		await Promise.all([
			listCropsByFarm(db, farm.id),
			listFieldsByFarm(db, farm.id),
			findHerdByFarm(db, farm.id),
			listPriceSetsByFarm(db, farm.id),
			listFieldOperationsByFarm(db, farm.id),
			listCropPracticesByFarm(db, farm.id),
			listRotationsByFarm(db, farm.id),
			listPlansByFarm(db, farm.id)
		]);
	const show = displayUnits(farm.unitSystem);
	// Every crop a price or practice names is one of the farm's crops (imports write them first).
	const cropById = new Map(crops.map((crop) => [crop.id, crop]));
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
		fields: fields.map((field) => ({
			id: field.id,
			name: field.name,
			area: show.amount(field.acres, 'area'),
			productivityIndex: field.productivityIndex,
			priorCrop: field.priorCrop,
			notes: field.notes
		})),
		herd: herd && {
			head: herd.head,
			averageWeight: show.amount(herd.averageWeightLb, 'mass'),
			intakeDmPerAuDay: show.amount(herd.intakeLbDmPerAuDay, 'mass'),
			feedingSeasonStartMonth: herd.feedingSeasonStartMonth,
			feedingSeasonDays: herd.feedingSeasonDays,
			baleWeight: show.amount(herd.baleWeightLb, 'mass'),
			baleDryMatterPercent: herd.baleDryMatterPercent,
			feedingWastePercent: herd.feedingWastePercent,
			choreHoursPerDayFeedingHay: herd.choreHoursPerDayFeedingHay,
			choreHoursPerDayGrazing: herd.choreHoursPerDayGrazing
		},
		priceSets: priceSets.map((set) => ({
			id: set.id,
			year: set.year,
			nitrogenUsdPerMass: show.pricePer(set.nitrogenUsdPerLb, 'mass'),
			dieselUsdPerVolume: show.pricePer(set.dieselUsdPerGallon, 'volume'),
			labourUsdPerHour: set.labourUsdPerHour,
			hayUsdPerBale: set.hayUsdPerBale,
			cropPrices: set.items.flatMap((item) => {
				const crop = cropById.get(item.key);
				return crop ? [{ crop: crop.name, ...show.cropPrice(item.priceUsd, crop) }] : [];
			})
		})),
		operations: operations.map((op) => ({
			id: op.id,
			name: op.name,
			by: op.by,
			month: op.month,
			speed: show.amount(op.speedMph, 'speed'),
			width: show.amount(op.widthFt, 'length'),
			fieldEfficiencyPercent: op.fieldEfficiencyPercent,
			repairsUsdPerArea: show.pricePer(op.repairsUsdPerAcre, 'area')
		})),
		practices: practices.flatMap((practice) => {
			const crop = cropById.get(practice.crop);
			if (!crop) return [];
			return [
				{
					id: practice.id,
					name: practice.name,
					crop: crop.name,
					yieldGoal: show.yieldPerArea(practice.yieldGoalPerAcre, crop),
					chemicalsUsdPerArea: show.pricePer(practice.chemicalsUsdPerAcre, 'area'),
					otherFertiliserUsdPerArea: show.pricePer(practice.otherFertiliserUsdPerAcre, 'area')
				}
			];
		}),
		rotations,
		plans
	};
}) satisfies PageServerLoad;
