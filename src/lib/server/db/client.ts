import { drizzle } from 'drizzle-orm/node-postgres';
import { PgTransaction } from 'drizzle-orm/pg-core';
import pg from 'pg';
import * as schema from './schema';

/** A pool and its Drizzle handle; the app makes one (db/index.ts), scripts and tests make their own. */
export function createDb(connectionString: string) {
	const pool = new pg.Pool({ connectionString, max: 10 });
	const db = drizzle(pool, { schema, casing: 'snake_case' });
	return { pool, db };
}

export type Db = ReturnType<typeof createDb>['db'];
/** A transaction handle: query functions take `Db | Tx` so callers can group writes. */
export type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];

type Read = () => unknown;

/**
 * Independent reads: all at once on the pool, each on a connection of its own, but one after another
 * in a transaction, which holds one connection. There pg would only queue them, and pg 8 warns that
 * pg 9 refuses a query sent while another waits.
 */
export async function readAll<const T extends readonly Read[]>(
	db: Db | Tx,
	reads: T
): Promise<{ -readonly [K in keyof T]: Awaited<ReturnType<T[K]>> }> {
	type Results = { -readonly [K in keyof T]: Awaited<ReturnType<T[K]>> };
	if (!(db instanceof PgTransaction)) return Promise.all(reads.map((read) => read())) as Results;
	const results: unknown[] = [];
	for (const read of reads) results.push(await read());
	return results as Results;
}
