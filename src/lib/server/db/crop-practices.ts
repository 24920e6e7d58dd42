import { asc, eq } from 'drizzle-orm';
import type { PlanDocument, PlanDocumentInput } from '$lib/schemas/plan-file';
import type { Db, Tx } from './client';
import { findIdsByKey, type IdsByKey } from './keys';
import { cropPractices, practiceOperations } from './schema';

type CropPracticeInput = PlanDocumentInput['practices'][number];

/**
 * Adds the practices the farm does not have yet (by plan-file id), each with its operations (row ids
 * by plan-file id in `operationIds`), in one transaction; the row ids of all of them.
 */
export async function insertCropPractices(
	db: Db | Tx,
	farmId: string,
	practices: PlanDocument['practices'],
	operationIds: IdsByKey
): Promise<IdsByKey> {
	return db.transaction(async (tx) => {
		const added = await tx
			.insert(cropPractices)
			.values(
				practices.map(
					({
						id,
						name,
						crop,
						yieldGoalPerAcre,
						otherFertiliserUsdPerAcre,
						chemicalsUsdPerAcre,
						otherDirectUsdPerAcre,
						operations: _,
						...detail
					}) => ({
						farmId,
						key: id,
						name,
						crop,
						yieldGoalPerAcre,
						otherFertiliserUsdPerAcre,
						chemicalsUsdPerAcre,
						otherDirectUsdPerAcre,
						detail
					})
				)
			)
			.onConflictDoNothing()
			.returning({ id: cropPractices.id, key: cropPractices.key });
		const byKey = new Map(practices.map((practice) => [practice.id, practice]));
		const steps = added.flatMap(({ id, key }) =>
			byKey.get(key)!.operations.map((step, i) => ({
				practiceId: id,
				sequence: i + 1,
				operationId: operationIds.get(step.operationId)!,
				month: step.month ?? null,
				passes: step.passes
			}))
		);
		if (steps.length) await tx.insert(practiceOperations).values(steps);
		return findIdsByKey(
			tx,
			cropPractices,
			farmId,
			practices.map((practice) => practice.id)
		);
	});
}

/** The farm's practices by name, with what the farm data page lists. */
export async function listCropPracticesByFarm(db: Db | Tx, farmId: string) {
	return db.query.cropPractices.findMany({
		columns: {
			id: true,
			name: true,
			crop: true,
			yieldGoalPerAcre: true,
			chemicalsUsdPerAcre: true,
			otherFertiliserUsdPerAcre: true
		},
		where: eq(cropPractices.farmId, farmId),
		orderBy: asc(cropPractices.name)
	});
}

/** The farm's practices as the plan file states them, operations by their plan-file ids. */
export async function exportCropPractices(
	db: Db | Tx,
	farmId: string
): Promise<CropPracticeInput[]> {
	const rows = await db.query.cropPractices.findMany({
		where: eq(cropPractices.farmId, farmId),
		orderBy: asc(cropPractices.key),
		with: { operations: { with: { operation: { columns: { key: true } } } } }
	});
	return rows.map((practice) => ({
		...practice.detail,
		id: practice.key,
		name: practice.name,
		crop: practice.crop,
		yieldGoalPerAcre: practice.yieldGoalPerAcre,
		otherFertiliserUsdPerAcre: practice.otherFertiliserUsdPerAcre,
		chemicalsUsdPerAcre: practice.chemicalsUsdPerAcre,
		otherDirectUsdPerAcre: practice.otherDirectUsdPerAcre,
		operations: [...practice.operations]
			.sort((a, b) => a.sequence - b.sequence)
			.map((step) => ({
				operationId: step.operation.key,
				...(step.month === null ? {} : { month: step.month }),
				passes: step.passes
			}))
	}));
}
