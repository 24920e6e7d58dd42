// readAll: independent reads at once on the pool, one after another inside a transaction (one
// connection, where pg 8 queues queries and warns that pg 9 refuses one sent while another waits).
import { sql } from 'drizzle-orm';
import { describe, expect, it } from 'vitest';
import { readAll, type Db, type Tx } from '../../src/lib/server/db/client';
import { testDb } from '../support/db';

const db = testDb();

/** Three reads that log when each starts and when its answer came. */
function loggedReads(on: Db | Tx, log: string[]) {
	return [1, 2, 3].map((n) => async () => {
		log.push(`start ${n}`);
		const [row] = (await on.execute<{ n: number }>(sql`select ${n}::int as n`)).rows;
		log.push(`end ${n}`);
		return row.n;
	});
}

describe('readAll', () => {
	it('sends every read at once on the pool, and answers in the order asked', async () => {
		const log: string[] = [];
		expect(await readAll(db, loggedReads(db, log))).toEqual([1, 2, 3]);
		expect(log.slice(0, 3)).toEqual(['start 1', 'start 2', 'start 3']);
	});

	it('in a transaction, starts each read only when the one before has its answer', async () => {
		const log: string[] = [];
		const answers = await db.transaction((tx) => readAll(tx, loggedReads(tx, log)));
		expect(answers).toEqual([1, 2, 3]);
		expect(log).toEqual(['start 1', 'end 1', 'start 2', 'end 2', 'start 3', 'end 3']);
	});
});
