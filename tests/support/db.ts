import { afterAll } from 'vitest';
import { createDb } from '../../src/lib/server/db/client';

/** The test database, for checking what a request saved (or did not). Closed after the file's tests. */
export function testDb() {
	const url = process.env.DATABASE_URL;
	if (!url) throw new Error('DATABASE_URL is not set: run the tests with `npm test`.');
	const handle = createDb(url);
	afterAll(() => handle.pool.end());
	return handle.db;
}
