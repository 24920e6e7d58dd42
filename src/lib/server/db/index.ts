import { env } from '$env/dynamic/private';
import { createDb } from './client';

if (!env.DATABASE_URL)
	throw new Error('DATABASE_URL is not set: run `npm start` once to write .env');

const { pool, db } = createDb(env.DATABASE_URL);

// An idle pool would keep the server alive for seconds after SIGTERM.
process.on('sveltekit:shutdown', () => pool.end());

export { db, pool };
