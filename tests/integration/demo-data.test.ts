// The check that the suites leave the seeded demo alone (after-all/demo-unchanged.test.ts) must see a
// change to any demo row, and nothing else. Everything here happens in a transaction rolled back.
import { describe, expect, it } from 'vitest';
import { demoDataChanges, dumpDemoData, findDemoRoots } from '../support/demo-data';
import { testPool } from '../support/db';
import { demoUsers } from '../support/server';

const pool = testPool();

describe('the demo data dump', () => {
	it('names a changed, an added and a removed demo row, and ignores other farms', async () => {
		const client = await pool.connect();
		try {
			await client.query('BEGIN');
			const roots = await findDemoRoots(client);
			const before = await dumpDemoData(client, roots);
			const maple = before.farms.find((farm) => farm.name === 'Maple Coulee Farm')!;
			expect(maple).toBeDefined();

			await client.query(`UPDATE farms SET region = region || ', east coulee' WHERE id = $1`, [
				maple.id
			]);
			await client.query(`INSERT INTO audit_log (farm_id, action) VALUES ($1, 'test.probe')`, [
				maple.id
			]);
			await client.query(
				`DELETE FROM memberships WHERE farm_id = $1
				AND user_id = (SELECT id FROM users WHERE email = $2)`,
				[maple.id, demoUsers.lender]
			);
			const other = await client.query(
				`INSERT INTO farms (name, labour_hours_available_by_month, interest_rate_percent)
				VALUES ('Not the demo', '[0,0,0,0,0,0,0,0,0,0,0,0]', 5) RETURNING id`
			);
			await client.query(`INSERT INTO audit_log (farm_id, action) VALUES ($1, 'test.other')`, [
				other.rows[0].id
			]);

			expect(demoDataChanges(before, await dumpDemoData(client, roots))).toEqual([
				expect.stringMatching(/^audit_log: row added \{.*"action":"test\.probe"/),
				`farms ${maple.id}: region ${JSON.stringify(maple.region)} → ${JSON.stringify(`${maple.region}, east coulee`)}`,
				expect.stringMatching(/^memberships: row removed \{.*"role":"reviewer"/)
			]);
		} finally {
			await client.query('ROLLBACK');
			client.release();
		}
	});
});
