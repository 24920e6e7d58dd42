import { and, asc, eq, ne } from 'drizzle-orm';
import { keyFromName, type FieldBody } from '$lib/schemas/farm-setup';
import type { PlanDocument } from '$lib/schemas/plan-file';
import { duplicateNames } from '../csv-upload';
import { insertAuditEntry } from './audit';
import type { Db, Tx } from './client';
import { findIdsByKey, type IdsByKey, isRowId } from './keys';
import { farms, fields, planFieldAssignments, plans, planVersions } from './schema';

/** Adds the fields the farm does not have yet (by plan-file id); the row ids of all of them. */
export async function insertFields(
	db: Db | Tx,
	farmId: string,
	input: PlanDocument['fields']
): Promise<IdsByKey> {
	if (input.length) {
		await db
			.insert(fields)
			.values(input.map(({ id, ...field }) => ({ ...field, farmId, key: id })))
			.onConflictDoNothing();
	}
	return findIdsByKey(
		db,
		fields,
		farmId,
		input.map((field) => field.id)
	);
}

/** The farm's fields by name, with what the farm data page lists. */
export async function listFieldsByFarm(db: Db | Tx, farmId: string) {
	return db.query.fields.findMany({
		columns: {
			id: true,
			name: true,
			acres: true,
			productivityIndex: true,
			priorCrop: true,
			tenure: true,
			cashRentUsdPerAcre: true,
			notes: true
		},
		where: eq(fields.farmId, farmId),
		orderBy: [asc(fields.name), asc(fields.key)]
	});
}

/** A field as the API and the fields page give it: the row id, the plan-file id as `key`, the rest. */
const fieldColumns = {
	id: true,
	key: true,
	name: true,
	acres: true,
	productivityIndex: true,
	priorCrop: true,
	priorCropNitrogenCreditLbPerAcre: true,
	tenure: true,
	cashRentUsdPerAcre: true,
	notes: true
} as const;

export type FieldRow = Omit<FieldBody, 'key'> & { id: string; key: string };

/** The farm's fields by name, every column the API states. */
export async function listFields(db: Db | Tx, farmId: string): Promise<FieldRow[]> {
	return db.query.fields.findMany({
		columns: fieldColumns,
		where: eq(fields.farmId, farmId),
		orderBy: [asc(fields.name), asc(fields.key)]
	});
}

/** One of the farm's fields; undefined for another farm's field or an id that is not a UUID. */
export async function findFieldById(
	db: Db | Tx,
	farmId: string,
	fieldId: string
): Promise<FieldRow | undefined> {
	if (!isRowId(fieldId)) return undefined;
	return db.query.fields.findFirst({
		columns: fieldColumns,
		where: and(eq(fields.farmId, farmId), eq(fields.id, fieldId))
	});
}

/**
 * The plan-file id a field saves under: `wanted` when no other field of the farm has it (undefined when
 * one does), else one made from the name. `fieldId` is the field being changed, whose own key is free.
 */
export async function chooseFieldKey(
	db: Db | Tx,
	farmId: string,
	{ name, wanted, fieldId }: { name: string; wanted?: string; fieldId?: string }
): Promise<string | undefined> {
	const rows = await db
		.select({ key: fields.key })
		.from(fields)
		.where(and(eq(fields.farmId, farmId), fieldId ? ne(fields.id, fieldId) : undefined));
	const taken = new Set(rows.map((row) => row.key));
	if (wanted !== undefined) return taken.has(wanted) ? undefined : wanted;
	return keyFromName(name, taken, 'field');
}

/** Adds one field (its key already chosen and free) and its audit entry, together. */
export async function insertField(
	db: Db | Tx,
	farmId: string,
	userId: string,
	field: FieldBody & { key: string }
): Promise<FieldRow> {
	return db.transaction(async (tx) => {
		const [row] = await tx
			.insert(fields)
			.values({ ...field, farmId })
			.returning(fieldReturning);
		await insertAuditEntry(tx, {
			farmId,
			userId,
			action: 'field.created',
			detail: { fieldId: row.id, name: row.name }
		});
		return row;
	});
}

/**
 * Adds every field of a CSV upload, or none: in one transaction that locks the farm's fields against a
 * concurrent import, refusing (nothing added) when a name repeats in the file or matches a field the
 * farm has. Keys are made from the names.
 */
export async function importFields(
	db: Db | Tx,
	farmId: string,
	userId: string,
	input: Omit<FieldBody, 'key'>[]
): Promise<{ imported: number } | { duplicates: string[] }> {
	return db.transaction(async (tx) => {
		const existing = await tx
			.select({ key: fields.key, name: fields.name })
			.from(farms)
			.leftJoin(fields, eq(fields.farmId, farms.id))
			.where(eq(farms.id, farmId))
			.for('update', { of: farms });
		const names = new Set(existing.flatMap((row) => (row.name ? [row.name.toLowerCase()] : [])));
		const duplicates = duplicateNames(
			input.map((field) => field.name),
			names
		);
		if (duplicates.length) return { duplicates };
		const taken = new Set(existing.flatMap((row) => (row.key ? [row.key] : [])));
		const rows = input.map((field) => {
			const key = keyFromName(field.name, taken, 'field');
			taken.add(key);
			return { ...field, key, farmId };
		});
		if (rows.length) await tx.insert(fields).values(rows);
		await insertAuditEntry(tx, {
			farmId,
			userId,
			action: 'fields.imported',
			detail: { count: rows.length, names: rows.map((row) => row.name) }
		});
		return { imported: rows.length };
	});
}

/** Replaces a field's values (its key already checked free) and records who did it, together. */
export async function updateField(
	db: Db | Tx,
	farmId: string,
	userId: string,
	fieldId: string,
	field: FieldBody & { key: string }
): Promise<FieldRow> {
	return db.transaction(async (tx) => {
		const [row] = await tx
			.update(fields)
			.set(field)
			.where(and(eq(fields.farmId, farmId), eq(fields.id, fieldId)))
			.returning(fieldReturning);
		await insertAuditEntry(tx, {
			farmId,
			userId,
			action: 'field.updated',
			detail: { fieldId, name: row.name }
		});
		return row;
	});
}

/** The names of the farm's plans with a version that assigns the field (deleting it would drop them). */
export async function listPlansUsingField(db: Db | Tx, fieldId: string): Promise<string[]> {
	const rows = await db
		.selectDistinct({ name: plans.name })
		.from(planFieldAssignments)
		.innerJoin(planVersions, eq(planVersions.id, planFieldAssignments.planVersionId))
		.innerJoin(plans, eq(plans.id, planVersions.planId))
		.where(eq(planFieldAssignments.fieldId, fieldId))
		.orderBy(asc(plans.name));
	return rows.map((row) => row.name);
}

/**
 * Deletes a field no plan uses, with its audit entry, in one transaction that locks the field first, so a
 * plan saved meanwhile cannot lose it; the plans that use it (nothing deleted) when there are any.
 */
export async function deleteField(
	db: Db | Tx,
	farmId: string,
	userId: string,
	field: Pick<FieldRow, 'id' | 'name'>
): Promise<{ deleted: true } | { deleted: false; planNames: string[] }> {
	return db.transaction(async (tx) => {
		await tx
			.select({ id: fields.id })
			.from(fields)
			.where(and(eq(fields.farmId, farmId), eq(fields.id, field.id)))
			.for('update');
		const planNames = await listPlansUsingField(tx, field.id);
		if (planNames.length) return { deleted: false, planNames };
		await tx.delete(fields).where(and(eq(fields.farmId, farmId), eq(fields.id, field.id)));
		await insertAuditEntry(tx, {
			farmId,
			userId,
			action: 'field.deleted',
			detail: { fieldId: field.id, name: field.name }
		});
		return { deleted: true };
	});
}

const fieldReturning = {
	id: fields.id,
	key: fields.key,
	name: fields.name,
	acres: fields.acres,
	productivityIndex: fields.productivityIndex,
	priorCrop: fields.priorCrop,
	priorCropNitrogenCreditLbPerAcre: fields.priorCropNitrogenCreditLbPerAcre,
	tenure: fields.tenure,
	cashRentUsdPerAcre: fields.cashRentUsdPerAcre,
	notes: fields.notes
};
