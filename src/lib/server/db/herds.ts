import { eq } from 'drizzle-orm';
import type { Herd } from '$lib/schemas/plan-file';
import type { Db, Tx } from './client';
import { herds } from './schema';

/** Sets the farm's herd unless it has one already. */
export async function insertHerd(db: Db | Tx, farmId: string, herd: Herd) {
	await db
		.insert(herds)
		.values({ ...herd, farmId })
		.onConflictDoNothing();
}

/** The farm's herd with what the farm data page shows; null when the farm keeps none. */
export async function findHerdByFarm(db: Db | Tx, farmId: string) {
	const herd = await db.query.herds.findFirst({
		columns: {
			head: true,
			averageWeightLb: true,
			intakeLbDmPerAuDay: true,
			feedingSeasonStartMonth: true,
			feedingSeasonDays: true,
			baleWeightLb: true,
			baleDryMatterPercent: true,
			feedingWastePercent: true,
			choreHoursPerDayFeedingHay: true,
			choreHoursPerDayGrazing: true
		},
		where: eq(herds.farmId, farmId)
	});
	return herd ?? null;
}
