import { asc, eq } from 'drizzle-orm';
import type { PlanDocument } from '$lib/schemas/plan-file';
import type { Db, Tx } from './client';
import { findIdsByKey, type IdsByKey } from './keys';
import { fields } from './schema';

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
			notes: true
		},
		where: eq(fields.farmId, farmId),
		orderBy: asc(fields.name)
	});
}
