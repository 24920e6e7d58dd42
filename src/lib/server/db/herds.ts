import { eq } from 'drizzle-orm';
import type { Herd } from '$lib/schemas/plan-file';
import { insertAuditEntry } from './audit';
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

/** Every value of the plan file's herd: what the herd page and API show. */
const herdReturning = {
	head: herds.head,
	averageWeightLb: herds.averageWeightLb,
	intakeLbDmPerAuDay: herds.intakeLbDmPerAuDay,
	feedingSeasonStartMonth: herds.feedingSeasonStartMonth,
	feedingSeasonDays: herds.feedingSeasonDays,
	maxGrazingDays: herds.maxGrazingDays,
	baleWeightLb: herds.baleWeightLb,
	baleDryMatterPercent: herds.baleDryMatterPercent,
	feedingWastePercent: herds.feedingWastePercent,
	choreHoursPerDayFeedingHay: herds.choreHoursPerDayFeedingHay,
	choreHoursPerDayGrazing: herds.choreHoursPerDayGrazing,
	manureNitrogenLbPerAuDay: herds.manureNitrogenLbPerAuDay,
	manureNitrogenAvailablePercent: herds.manureNitrogenAvailablePercent
};

/** The farm's herd as the plan file states it; null when the farm keeps no cattle. */
export async function findHerd(db: Db | Tx, farmId: string): Promise<Herd | null> {
	const [herd] = await db.select(herdReturning).from(herds).where(eq(herds.farmId, farmId));
	return herd ?? null;
}

/** Creates or replaces the farm's herd, with its audit entry, together; the herd as stored. */
export async function saveHerd(
	db: Db | Tx,
	farmId: string,
	userId: string,
	herd: Herd
): Promise<Herd> {
	return db.transaction(async (tx) => {
		const [row] = await tx
			.insert(herds)
			.values({ ...herd, farmId })
			.onConflictDoUpdate({ target: herds.farmId, set: { ...herd, updatedAt: new Date() } })
			.returning(herdReturning);
		await insertAuditEntry(tx, {
			farmId,
			userId,
			action: 'herd.updated',
			detail: { head: row.head }
		});
		return row;
	});
}

/** Records that the farm keeps no cattle: deletes its herd with the audit entry; false when it had none. */
export async function deleteHerd(db: Db | Tx, farmId: string, userId: string): Promise<boolean> {
	return db.transaction(async (tx) => {
		const deleted = await tx
			.delete(herds)
			.where(eq(herds.farmId, farmId))
			.returning({ id: herds.id });
		if (!deleted.length) return false;
		await insertAuditEntry(tx, { farmId, userId, action: 'herd.deleted' });
		return true;
	});
}
