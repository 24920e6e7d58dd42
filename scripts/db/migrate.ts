// Applies the committed SQL migrations in drizzle/ to DATABASE_URL.
import './load-env';
import { migrate } from 'drizzle-orm/node-postgres/migrator';
import { createDb } from '../../src/lib/server/db/client';

const url = process.env.DATABASE_URL;
if (!url) throw new Error('DATABASE_URL is not set: run `npm start` once to write .env');
const { db, pool } = createDb(url);
try {
	await migrate(db, { migrationsFolder: 'drizzle' });
} finally {
	await pool.end();
}
