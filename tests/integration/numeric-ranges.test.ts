// A number too large for its column never reaches the database: the schema's range answers 422 first.
import { eq } from 'drizzle-orm';
import { beforeAll, describe, expect, it } from 'vitest';
import { farms } from '../../src/lib/server/db/schema';
import { testDb } from '../support/db';
import { newUser, type Client } from '../support/http';

const db = testDb();
const settings = {
	name: 'Range Check Farm',
	region: 'Test',
	unitSystem: 'us',
	labourHoursAvailableByMonth: Array(12).fill(200),
	interestRatePercent: 6,
	fixedCostsUsdPerYear: 40000
};

let owner: Client;
let farmId: string;

beforeAll(async () => {
	owner = await newUser('ranges');
	const response = await owner.json('/api/v1/farms', 'POST', settings);
	expect(response.status).toBe(201);
	farmId = (await response.json()).farm.id;
});

describe('numbers past a column’s size', () => {
	it('refuses fixed costs of $10^12 (numeric 12,2 holds under $10^10) with 422 and the range', async () => {
		const response = await owner.json(`/api/v1/farms/${farmId}`, 'PUT', {
			...settings,
			fixedCostsUsdPerYear: 1e12
		});
		expect(response.status).toBe(422);
		const body = await response.json();
		expect(body.issues).toContainEqual({
			path: 'fixedCostsUsdPerYear',
			message: 'Fixed costs must be at most $100,000,000 per year.'
		});
		const [row] = await db
			.select({ fixedCostsUsdPerYear: farms.fixedCostsUsdPerYear })
			.from(farms)
			.where(eq(farms.id, farmId));
		expect(row.fixedCostsUsdPerYear).toBe(40000);
	});

	it('refuses a new farm with 1e308 hours in a month and creates nothing', async () => {
		const name = `Too Many Hours ${crypto.randomUUID().slice(0, 6)}`;
		const response = await owner.json('/api/v1/farms', 'POST', {
			...settings,
			name,
			labourHoursAvailableByMonth: [1e308, ...Array(11).fill(200)]
		});
		expect(response.status).toBe(422);
		expect((await response.json()).issues).toContainEqual({
			path: 'labourHoursAvailableByMonth.0',
			message: 'Labour hours in a month must be at most 744 hours.'
		});
		expect(await db.select().from(farms).where(eq(farms.name, name))).toEqual([]);
	});
});
