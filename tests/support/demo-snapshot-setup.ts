// Takes the seeded demo's rows before any test runs, for tests/integration/after-all to compare with.
import pg from 'pg';
import type { TestProject } from 'vitest/node';
import { dumpDemoData, findDemoRoots, type DemoDump, type DemoRoots } from './demo-data';

declare module 'vitest' {
	export interface ProvidedContext {
		seededDemo: { roots: DemoRoots; dump: DemoDump };
	}
}

export async function setup(project: TestProject) {
	if (!process.env.DATABASE_URL) {
		throw new Error('DATABASE_URL is not set: run the tests with `npm test`.');
	}
	const pool = new pg.Pool({ connectionString: process.env.DATABASE_URL });
	try {
		const roots = await findDemoRoots(pool);
		project.provide('seededDemo', { roots, dump: await dumpDemoData(pool, roots) });
	} finally {
		await pool.end();
	}
}
