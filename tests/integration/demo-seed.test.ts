import { execFile } from 'node:child_process';
import { describe, it } from 'vitest';
import { inArray } from 'drizzle-orm';
import { memberships, users } from '../../src/lib/server/db/schema';
import { testDb } from '../support/db';
import { demoUsers } from '../support/server';

const db = testDb();

/**
 * The rows a seed run writes: the demo's people and their memberships. Only these are counted, as
 * other files add accounts and farms of their own at the same time.
 */
async function demoRows() {
	const demoUserIds = db
		.select({ id: users.id })
		.from(users)
		.where(inArray(users.email, Object.values(demoUsers)));
	return {
		users: await db.$count(users, inArray(users.email, Object.values(demoUsers))),
		memberships: await db.$count(memberships, inArray(memberships.userId, demoUserIds))
	};
}

/** `npm run db:seed` (tsx's loader in one node process) as a child, without blocking this one. */
function seed(env: NodeJS.ProcessEnv = process.env) {
	return new Promise<{ code: number; stdout: string; stderr: string }>((resolve) => {
		execFile(
			process.execPath,
			['--import', 'tsx', 'scripts/db/seed-demo.ts'],
			{ env },
			(error, stdout, stderr) => resolve({ code: error ? Number(error.code) : 0, stdout, stderr })
		);
	});
}

// Neither run writes anything, so the two run at the same time.
describe.concurrent('the demo seed', () => {
	it('refuses to run without FURROWCAST_DEMO=1, so demo sign-ins never reach another database', async ({
		expect
	}) => {
		const before = await demoRows();
		// Set but not 1, as on a server that is not a demo (variables already set win over .env).
		const run = await seed({ ...process.env, FURROWCAST_DEMO: '' });
		expect(run.code).toBe(1);
		expect(run.stderr).toContain('Refusing to seed demo accounts');
		expect(await demoRows()).toEqual(before);
	});

	it('leaves an already seeded database as it is', async ({ expect }) => {
		const before = await demoRows();
		const run = await seed();
		expect(run.code).toBe(0);
		expect(run.stdout).toContain('demo data already present');
		expect(await demoRows()).toEqual(before);
	});
});
