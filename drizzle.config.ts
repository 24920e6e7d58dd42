import { defineConfig } from 'drizzle-kit';

if (!process.env.DATABASE_URL)
	throw new Error('DATABASE_URL is not set: run `npm start` once to write .env');

export default defineConfig({
	schema: './src/lib/server/db/schema.ts',
	out: './drizzle',
	dialect: 'postgresql',
	casing: 'snake_case',
	dbCredentials: { url: process.env.DATABASE_URL },
	strict: true,
	verbose: true
});
