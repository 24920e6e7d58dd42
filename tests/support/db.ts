import pg from 'pg';
import { afterAll } from 'vitest';
import { createDb } from '../../src/lib/server/db/client';

function databaseUrl(): string {
	const url = process.env.DATABASE_URL;
	if (!url) throw new Error('DATABASE_URL is not set: run the tests with `npm test`.');
	return url;
}

/** The test database, for checking what a request saved (or did not). Closed after the file's tests. */
export function testDb() {
	const handle = createDb(databaseUrl());
	afterAll(() => handle.pool.end());
	return handle.db;
}

/** The test database for plain SQL, and for transactions a test rolls back. */
export function testPool() {
	const pool = new pg.Pool({ connectionString: databaseUrl() });
	afterAll(() => pool.end());
	return pool;
}
