import { and, asc, eq, ne } from 'drizzle-orm';
import { keyFromName } from '$lib/schemas/farm-setup';
import type { OperationBody } from '$lib/schemas/operations';
import type { PlanDocument, PlanDocumentInput } from '$lib/schemas/plan-file';
import { insertAuditEntry } from './audit';
import type { Db, Tx } from './client';
import { findIdsByKey, type IdsByKey, isRowId } from './keys';
import { cropPractices, fieldOperations, practiceOperations } from './schema';

type FieldOperationInput = NonNullable<PlanDocumentInput['operations']>[number];
/** Omit over each member of a union (plain `Omit` merges the members). */
type OmitEach<T, K extends PropertyKey> = T extends unknown ? Omit<T, K> : never;

/** An operation as the API and the operations pages give it: the row id, the plan-file id as `key`, the rest. */
/** An operation's values as stated, without its ids (what the forms, figures and API bodies share). */
export type StatedOperation = OmitEach<PlanDocument['operations'][number], 'id'>;

export type OperationRow = StatedOperation & {
	id: string;
	key: string;
	copiedFrom: string | null;
};

/** Adds the operations the farm does not have yet (by plan-file id); the row ids of all of them. */
export async function insertFieldOperations(
	db: Db | Tx,
	farmId: string,
	operations: PlanDocument['operations']
): Promise<IdsByKey> {
	if (operations.length) {
		await db
			.insert(fieldOperations)
			.values(operations.map(({ id, ...op }) => rowOf(farmId, id, op)))
			.onConflictDoNothing();
	}
	return findIdsByKey(
		db,
		fieldOperations,
		farmId,
		operations.map((op) => op.id)
	);
}

/** The farm's operations by month, with what the farm data page lists. */
export async function listFieldOperationsByFarm(db: Db | Tx, farmId: string) {
	return db.query.fieldOperations.findMany({
		columns: {
			id: true,
			name: true,
			by: true,
			month: true,
			speedMph: true,
			widthFt: true,
			fieldEfficiencyPercent: true,
			repairsUsdPerAcre: true
		},
		where: eq(fieldOperations.farmId, farmId),
		orderBy: [asc(fieldOperations.month), asc(fieldOperations.name), asc(fieldOperations.key)]
	});
}

/** The farm's operations as the plan file states them. */
export async function exportFieldOperations(
	db: Db | Tx,
	farmId: string
): Promise<FieldOperationInput[]> {
	const rows = await db.query.fieldOperations.findMany({
		where: eq(fieldOperations.farmId, farmId),
		orderBy: asc(fieldOperations.key)
	});
	return rows.map(operationOf);
}

/** Every column an operation states, the ones its kind does not use set to null (so a change of kind clears them). */
function rowOf(
	farmId: string,
	key: string,
	op: StatedOperation
): typeof fieldOperations.$inferInsert {
	const row = {
		farmId,
		key,
		name: op.name,
		by: op.by,
		month: op.month,
		statedAs: null,
		speedMph: null,
		widthFt: null,
		fieldEfficiencyPercent: null,
		fuelBasis: null,
		dieselGallonsPerAcre: null,
		tractorMaxPtoHp: null,
		dieselGallonsPerHpHour: null,
		labourFactor: null,
		repairsUsdPerAcre: null,
		machineHoursPerAcre: null,
		labourHoursPerAcre: null
	};
	if (op.by === 'custom') return row;
	if (op.statedAs === 'per-acre') {
		return {
			...row,
			statedAs: op.statedAs,
			dieselGallonsPerAcre: op.dieselGallonsPerAcre,
			machineHoursPerAcre: op.machineHoursPerAcre,
			labourHoursPerAcre: op.labourHoursPerAcre,
			repairsUsdPerAcre: op.repairsUsdPerAcre
		};
	}
	return {
		...row,
		statedAs: op.statedAs,
		speedMph: op.speedMph,
		widthFt: op.widthFt,
		fieldEfficiencyPercent: op.fieldEfficiencyPercent,
		fuelBasis: op.fuel.basis,
		dieselGallonsPerAcre: op.fuel.basis === 'per-acre' ? op.fuel.dieselGallonsPerAcre : null,
		tractorMaxPtoHp: op.fuel.basis === 'pto-power' ? op.fuel.tractorMaxPtoHp : null,
		dieselGallonsPerHpHour: op.fuel.basis === 'pto-power' ? op.fuel.dieselGallonsPerHpHour : null,
		labourFactor: op.labourFactor,
		repairsUsdPerAcre: op.repairsUsdPerAcre
	};
}

function operationOf(op: typeof fieldOperations.$inferSelect): PlanDocument['operations'][number] {
	const common = { id: op.key, name: op.name, month: op.month };
	if (op.by === 'custom') return { ...common, by: 'custom' };
	if (op.statedAs === 'per-acre') {
		return {
			...common,
			by: 'own',
			statedAs: 'per-acre',
			dieselGallonsPerAcre: op.dieselGallonsPerAcre!,
			machineHoursPerAcre: op.machineHoursPerAcre!,
			labourHoursPerAcre: op.labourHoursPerAcre!,
			repairsUsdPerAcre: op.repairsUsdPerAcre!
		};
	}
	const fuel =
		op.fuelBasis === 'pto-power'
			? {
					basis: 'pto-power' as const,
					tractorMaxPtoHp: op.tractorMaxPtoHp!,
					dieselGallonsPerHpHour: op.dieselGallonsPerHpHour!
				}
			: { basis: 'per-acre' as const, dieselGallonsPerAcre: op.dieselGallonsPerAcre! };
	return {
		...common,
		by: 'own',
		statedAs: 'machine',
		speedMph: op.speedMph!,
		widthFt: op.widthFt!,
		fieldEfficiencyPercent: op.fieldEfficiencyPercent!,
		fuel,
		labourFactor: op.labourFactor!,
		repairsUsdPerAcre: op.repairsUsdPerAcre!
	};
}

function rowAsListed(row: typeof fieldOperations.$inferSelect): OperationRow {
	const { id: key, ...op } = operationOf(row);
	return { id: row.id, key, copiedFrom: row.copiedFrom, ...op };
}

/** The farm's operations by month and name, every value the API states. */
export async function listFieldOperations(db: Db | Tx, farmId: string): Promise<OperationRow[]> {
	const rows = await db.query.fieldOperations.findMany({
		where: eq(fieldOperations.farmId, farmId),
		orderBy: [asc(fieldOperations.month), asc(fieldOperations.name), asc(fieldOperations.key)]
	});
	return rows.map(rowAsListed);
}

/** One of the farm's operations; undefined for another farm's operation or an id that is not a UUID. */
export async function findFieldOperationById(
	db: Db | Tx,
	farmId: string,
	operationId: string
): Promise<OperationRow | undefined> {
	if (!isRowId(operationId)) return undefined;
	const row = await db.query.fieldOperations.findFirst({
		where: and(eq(fieldOperations.farmId, farmId), eq(fieldOperations.id, operationId))
	});
	return row && rowAsListed(row);
}

/**
 * Adds operations and an audit entry for each, all in one transaction (the API adds one, a file upload
 * many). Each gets the key it asks for, or one made from the default it copies or its name; when a key
 * it asks for is taken (by the farm or an earlier one of `operations`), nothing is added and the answer
 * says which.
 */
export async function addFieldOperations(
	db: Db | Tx,
	farmId: string,
	userId: string,
	operations: OperationBody[]
): Promise<{ added: OperationRow[] } | { keyTaken: { index: number; key: string } }> {
	return db.transaction(async (tx) => {
		const taken = await operationKeys(tx, farmId);
		const rows: (typeof fieldOperations.$inferInsert)[] = [];
		for (const [index, { key: wanted, copiedFrom, ...op }] of operations.entries()) {
			if (wanted !== undefined && taken.has(wanted)) return { keyTaken: { index, key: wanted } };
			const key = wanted ?? keyFromName(copiedFrom ?? op.name, taken, 'operation');
			taken.add(key);
			rows.push({ ...rowOf(farmId, key, op), copiedFrom: copiedFrom ?? null });
		}
		if (!rows.length) return { added: [] };
		const inserted = await tx.insert(fieldOperations).values(rows).returning();
		await insertAuditEntries(tx, farmId, userId, 'operation.created', inserted);
		return { added: inserted.map(rowAsListed) };
	});
}

/** Whether no operation of the farm but `operationId` itself has the key (a change may keep or take it). */
export async function isFieldOperationKeyFree(
	db: Db | Tx,
	farmId: string,
	key: string,
	operationId: string
): Promise<boolean> {
	return !(await operationKeys(db, farmId, operationId)).has(key);
}

/** Replaces an operation's values (its key already checked free) and records who did it, together. */
export async function updateFieldOperation(
	db: Db | Tx,
	farmId: string,
	userId: string,
	operationId: string,
	{ key, copiedFrom, ...op }: OperationBody & { key: string }
): Promise<OperationRow> {
	return db.transaction(async (tx) => {
		const [row] = await tx
			.update(fieldOperations)
			.set({ ...rowOf(farmId, key, op), copiedFrom: copiedFrom ?? null })
			.where(and(eq(fieldOperations.farmId, farmId), eq(fieldOperations.id, operationId)))
			.returning();
		await insertAuditEntries(tx, farmId, userId, 'operation.updated', [row]);
		return rowAsListed(row);
	});
}

/** The names of the practices whose operations include this one (deleting it would break them). */
export async function listPracticesUsingOperation(
	db: Db | Tx,
	operationId: string
): Promise<string[]> {
	const rows = await db
		.selectDistinct({ name: cropPractices.name })
		.from(practiceOperations)
		.innerJoin(cropPractices, eq(cropPractices.id, practiceOperations.practiceId))
		.where(eq(practiceOperations.operationId, operationId))
		.orderBy(asc(cropPractices.name));
	return rows.map((row) => row.name);
}

/**
 * Deletes an operation no practice uses, with its audit entry, in one transaction that locks it first,
 * so a practice saved meanwhile cannot lose it; the practices that use it (nothing deleted) when any do.
 */
export async function deleteFieldOperation(
	db: Db | Tx,
	farmId: string,
	userId: string,
	operation: Pick<OperationRow, 'id' | 'name'>
): Promise<{ deleted: true } | { deleted: false; practiceNames: string[] }> {
	return db.transaction(async (tx) => {
		const where = and(eq(fieldOperations.farmId, farmId), eq(fieldOperations.id, operation.id));
		await tx.select({ id: fieldOperations.id }).from(fieldOperations).where(where).for('update');
		const practiceNames = await listPracticesUsingOperation(tx, operation.id);
		if (practiceNames.length) return { deleted: false, practiceNames };
		await tx.delete(fieldOperations).where(where);
		await insertAuditEntries(tx, farmId, userId, 'operation.deleted', [operation]);
		return { deleted: true };
	});
}

/** The keys the farm's operations have, less `exceptId`'s own. */
async function operationKeys(db: Db | Tx, farmId: string, exceptId?: string) {
	const rows = await db
		.select({ key: fieldOperations.key })
		.from(fieldOperations)
		.where(
			and(
				eq(fieldOperations.farmId, farmId),
				exceptId ? ne(fieldOperations.id, exceptId) : undefined
			)
		);
	return new Set(rows.map((row) => row.key));
}

async function insertAuditEntries(
	tx: Db | Tx,
	farmId: string,
	userId: string,
	action: 'operation.created' | 'operation.updated' | 'operation.deleted',
	operations: { id: string; name: string }[]
) {
	for (const op of operations) {
		await insertAuditEntry(tx, {
			farmId,
			userId,
			action,
			detail: { operationId: op.id, name: op.name }
		});
	}
}
