import { drizzle } from 'drizzle-orm/node-postgres';
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
