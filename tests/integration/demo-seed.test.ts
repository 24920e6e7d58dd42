import { spawnSync } from 'node:child_process';
import { describe, expect, it } from 'vitest';
import { users } from '../../src/lib/server/db/schema';
import { testDb } from '../support/db';

const db = testDb();

describe('the demo seed', () => {
	it('refuses to run without FURROWCAST_DEMO=1, so demo sign-ins never reach another database', async () => {
		const before = await db.$count(users);
		// Set but not 1, as on a server that is not a demo (variables already set win over .env).
		const env = { ...process.env, FURROWCAST_DEMO: '' };
		const run = spawnSync('npx', ['tsx', 'scripts/db/seed-demo.ts'], { env, encoding: 'utf8' });
		expect(run.status).toBe(1);
		expect(run.stderr).toContain('Refusing to seed demo accounts');
		expect(await db.$count(users)).toBe(before);
	});

	it('leaves an already seeded database as it is', async () => {
		const before = await db.$count(users);
		const run = spawnSync('npx', ['tsx', 'scripts/db/seed-demo.ts'], { encoding: 'utf8' });
		expect(run.status).toBe(0);
		expect(run.stdout).toContain('demo data already present');
		expect(await db.$count(users)).toBe(before);
	});
});
