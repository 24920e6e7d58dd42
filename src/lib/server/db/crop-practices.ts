import { and, asc, eq, ne } from 'drizzle-orm';
import { keyFromName } from '$lib/schemas/farm-setup';
import type { CropPractice, PlanDocument, PlanDocumentInput } from '$lib/schemas/plan-file';
import type { PracticeBody, PracticeValues } from '$lib/schemas/practices';
import { insertAuditEntry } from './audit';
import type { Db, Tx } from './client';
import { findIdsByKey, type IdsByKey, isRowId } from './keys';
import {
	cropPractices,
	fieldOperations,
	practiceOperations,
	rotations,
	rotationSteps
} from './schema';

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
		orderBy: [asc(cropPractices.name), asc(cropPractices.key)]
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

/** A practice as the API gives it: the row id, the plan-file id as `key`, the plan file's values. */
export type PracticeRow = PracticeValues & { id: string; key: string };

type StoredPractice = typeof cropPractices.$inferSelect & {
	operations: {
		sequence: number;
		month: number | null;
		passes: number;
		operation: { key: string };
	}[];
};

const withOperationKeys = {
	operations: { with: { operation: { columns: { key: true } } } }
} as const;

function practiceOf(row: StoredPractice): PracticeRow {
	return {
		...row.detail,
		id: row.id,
		key: row.key,
		name: row.name,
		crop: row.crop,
		yieldGoalPerAcre: row.yieldGoalPerAcre,
		otherFertiliserUsdPerAcre: row.otherFertiliserUsdPerAcre,
		chemicalsUsdPerAcre: row.chemicalsUsdPerAcre,
		otherDirectUsdPerAcre: row.otherDirectUsdPerAcre,
		operations: [...row.operations]
			.sort((a, b) => a.sequence - b.sequence)
			.map((step) => ({
				operationId: step.operation.key,
				...(step.month === null ? {} : { month: step.month }),
				passes: step.passes
			}))
	};
}

/** The farm's practices by name, each in the plan file's shape with its row id. */
export async function listPractices(db: Db | Tx, farmId: string): Promise<PracticeRow[]> {
	const rows = await db.query.cropPractices.findMany({
		where: eq(cropPractices.farmId, farmId),
		orderBy: [asc(cropPractices.name), asc(cropPractices.key)],
		with: withOperationKeys
	});
	return rows.map(practiceOf);
}

/** One of the farm's practices; undefined for another farm's practice or an id that is not a UUID. */
export async function findPracticeById(
	db: Db | Tx,
	farmId: string,
	practiceId: string
): Promise<PracticeRow | undefined> {
	if (!isRowId(practiceId)) return undefined;
	const row = await db.query.cropPractices.findFirst({
		where: and(eq(cropPractices.farmId, farmId), eq(cropPractices.id, practiceId)),
		with: withOperationKeys
	});
	return row && practiceOf(row);
}

/**
 * The plan-file id a practice saves under: `wanted` when no other practice of the farm has it (undefined
 * when one does), else one made from the name. `practiceId` is the practice being changed.
 */
export async function choosePracticeKey(
	db: Db | Tx,
	farmId: string,
	{ name, wanted, practiceId }: { name: string; wanted?: string; practiceId?: string }
): Promise<string | undefined> {
	const rows = await db
		.select({ key: cropPractices.key })
		.from(cropPractices)
		.where(
			and(
				eq(cropPractices.farmId, farmId),
				practiceId ? ne(cropPractices.id, practiceId) : undefined
			)
		);
	const taken = new Set(rows.map((row) => row.key));
	if (wanted !== undefined) return taken.has(wanted) ? undefined : wanted;
	return keyFromName(name, taken, 'practice');
}

/** The farm's field operations, by key, for naming and choosing a practice's operations. */
export async function listOperationChoices(db: Db | Tx, farmId: string) {
	return db
		.select({
			id: fieldOperations.id,
			key: fieldOperations.key,
			name: fieldOperations.name,
			month: fieldOperations.month
		})
		.from(fieldOperations)
		.where(eq(fieldOperations.farmId, farmId))
		.orderBy(asc(fieldOperations.month), asc(fieldOperations.name), asc(fieldOperations.key));
}

/**
 * A practice ready to save: its key chosen and its residue grazing stating the leaf and husk per unit
 * (the crop's own figure when the body leaves it out, as a plan file's import stores it).
 */
export type PracticeToSave = Omit<PracticeBody, 'key' | 'residueGrazing'> & {
	key: string;
	residueGrazing: CropPractice['residueGrazing'];
};

function columnsOf(practice: PracticeToSave) {
	const {
		key,
		name,
		crop,
		yieldGoalPerAcre,
		otherFertiliserUsdPerAcre,
		chemicalsUsdPerAcre,
		otherDirectUsdPerAcre,
		operations: _,
		...detail
	} = practice;
	return {
		key,
		name,
		crop,
		yieldGoalPerAcre,
		otherFertiliserUsdPerAcre,
		chemicalsUsdPerAcre,
		otherDirectUsdPerAcre,
		detail
	};
}

async function insertSteps(
	tx: Tx,
	practiceId: string,
	practice: PracticeToSave,
	operationIds: IdsByKey
) {
	if (!practice.operations.length) return;
	await tx.insert(practiceOperations).values(
		practice.operations.map((step, i) => ({
			practiceId,
			sequence: i + 1,
			operationId: operationIds.get(step.operationId)!,
			month: step.month ?? null,
			passes: step.passes
		}))
	);
}

/** Adds one practice with its operations and its audit entry, in one transaction. */
export async function insertPractice(
	db: Db | Tx,
	farmId: string,
	userId: string,
	practice: PracticeToSave,
	operationIds: IdsByKey
): Promise<PracticeRow> {
	return db.transaction(async (tx) => {
		const [row] = await tx
			.insert(cropPractices)
			.values({ ...columnsOf(practice), farmId })
			.returning({ id: cropPractices.id });
		await insertSteps(tx, row.id, practice, operationIds);
		await insertAuditEntry(tx, {
			farmId,
			userId,
			action: 'practice.created',
			detail: { practiceId: row.id, name: practice.name }
		});
		return (await findPracticeById(tx, farmId, row.id))!;
	});
}

/** Replaces a practice's values and operations and records who did it, in one transaction. */
export async function updatePractice(
	db: Db | Tx,
	farmId: string,
	userId: string,
	practiceId: string,
	practice: PracticeToSave,
	operationIds: IdsByKey
): Promise<PracticeRow> {
	return db.transaction(async (tx) => {
		await tx
			.update(cropPractices)
			.set(columnsOf(practice))
			.where(and(eq(cropPractices.farmId, farmId), eq(cropPractices.id, practiceId)));
		await tx.delete(practiceOperations).where(eq(practiceOperations.practiceId, practiceId));
		await insertSteps(tx, practiceId, practice, operationIds);
		await insertAuditEntry(tx, {
			farmId,
			userId,
			action: 'practice.updated',
			detail: { practiceId, name: practice.name }
		});
		return (await findPracticeById(tx, farmId, practiceId))!;
	});
}

/** The names of the farm's rotations that grow the practice in some year. */
export async function listRotationsUsingPractice(
	db: Db | Tx,
	practiceId: string
): Promise<string[]> {
	const rows = await db
		.selectDistinct({ name: rotations.name })
		.from(rotationSteps)
		.innerJoin(rotations, eq(rotations.id, rotationSteps.rotationId))
		.where(eq(rotationSteps.practiceId, practiceId))
		.orderBy(asc(rotations.name));
	return rows.map((row) => row.name);
}

/**
 * Deletes a practice no rotation uses, with its audit entry, in one transaction that locks the practice
 * first; the rotations that use it (nothing deleted) when there are any.
 */
export async function deletePractice(
	db: Db | Tx,
	farmId: string,
	userId: string,
	practice: Pick<PracticeRow, 'id' | 'name'>
): Promise<{ deleted: true } | { deleted: false; rotationNames: string[] }> {
	return db.transaction(async (tx) => {
		const where = and(eq(cropPractices.farmId, farmId), eq(cropPractices.id, practice.id));
		await tx.select({ id: cropPractices.id }).from(cropPractices).where(where).for('update');
		const rotationNames = await listRotationsUsingPractice(tx, practice.id);
		if (rotationNames.length) return { deleted: false, rotationNames };
		await tx.delete(cropPractices).where(where);
		await insertAuditEntry(tx, {
			farmId,
			userId,
			action: 'practice.deleted',
			detail: { practiceId: practice.id, name: practice.name }
		});
		return { deleted: true };
	});
}

/** The row ids of all the farm's practices by plan-file key, for resolving a rotation's years. */
export async function listPracticeIdsByKey(db: Db | Tx, farmId: string): Promise<IdsByKey> {
	const rows = await db
		.select({ id: cropPractices.id, key: cropPractices.key })
		.from(cropPractices)
		.where(eq(cropPractices.farmId, farmId));
	return new Map(rows.map((row) => [row.key, row.id]));
}
