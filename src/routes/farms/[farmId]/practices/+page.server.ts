import { requireFarmAccess, roleAllows } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import { listPractices } from '$lib/server/db/crop-practices';
import { listCropsWithBuiltIns } from '$lib/server/db/crops';
import type { PageServerLoad } from './$types';

export const load = (async (event) => {
	const { farm, role } = await requireFarmAccess(event, event.params.farmId, 'farm:view');
	const [practices, crops] = await Promise.all([
		listPractices(db, farm.id),
		listCropsWithBuiltIns(db, farm.id)
	]);
	const cropById = new Map(crops.map((crop) => [crop.id, crop]));
	return {
		farm: { id: farm.id, name: farm.name },
		canEdit: roleAllows(role, 'farm:edit'),
		practices: practices.map((practice) => {
			const crop = cropById.get(practice.crop);
			const cover = practice.coverMix;
			return {
				id: practice.id,
				name: practice.name,
				cropName: crop?.name ?? practice.crop,
				yieldGoalPerAcre: practice.yieldGoalPerAcre,
				saleUnit: crop?.soldBy ?? '',
				nitrogenLbPerAcre: practice.nitrogen.appliedLbPerAcre,
				cover: cover && {
					species: cover.species.map((s) => ({ seed: seedName(s.seedId), lbPerAcre: s.lbPerAcre })),
					biomassLbDmPerAcre: cover.biomassLbDmPerAcre
				},
				coverGrazedPercent: cover?.grazingUtilisationPercent ?? 0,
				residueGrazedPercent: practice.residueGrazing?.utilisationPercent ?? 0
			};
		})
	};
}) satisfies PageServerLoad;

/** A seed id read as words: "annual-ryegrass" → "annual ryegrass". */
function seedName(seedId: string): string {
	return seedId.replace(/-/g, ' ');
}
