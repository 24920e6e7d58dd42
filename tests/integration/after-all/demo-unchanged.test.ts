// Runs after the integration and end-to-end projects (vite.config.ts, sequence.groupOrder): tests build
// the data they change, so the seeded demo that people sign in to is as it was seeded.
import { expect, inject, it } from 'vitest';
import { demoDataChanges, dumpDemoData } from '../../support/demo-data';
import { testPool } from '../../support/db';

const pool = testPool();

it('the integration and end-to-end tests leave every seeded demo row as it was', async () => {
	const { roots, dump } = inject('seededDemo');
	expect(Object.keys(dump)).toEqual(expect.arrayContaining(['farms', 'users', 'fields', 'plans']));
	expect(demoDataChanges(dump, await dumpDemoData(pool, roots))).toEqual([]);
});
