import { and, eq, inArray } from 'drizzle-orm';
import { z } from 'zod';
import type { Db, Tx } from './client';
import type { cropPractices, fieldOperations, fields, rotations } from './schema';

/** Row ids by the plan file's own ids, which the farm's parts keep as `key`. */
export type IdsByKey = Map<string, string>;

export async function findIdsByKey(
	db: Db | Tx,
	table: typeof fields | typeof fieldOperations | typeof cropPractices | typeof rotations,
	farmId: string,
	keys: string[]
): Promise<IdsByKey> {
	if (!keys.length) return new Map();
	const rows = await db
		.select({ id: table.id, key: table.key })
		.from(table)
		.where(and(eq(table.farmId, farmId), inArray(table.key, keys)));
	return new Map(rows.map((row) => [row.key, row.id]));
}

const rowIdSchema = z.uuid();

/** Whether an id from a URL or body can be a row id at all: anything else is "not found", not a crash. */
export function isRowId(id: string): boolean {
	return rowIdSchema.safeParse(id).success;
}
