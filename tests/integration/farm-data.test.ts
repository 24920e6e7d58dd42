import { beforeAll, describe, expect, it } from 'vitest';
import { testDb } from '../support/db';
import { demoFarmId, farmFromScenario } from '../support/farms';
import { signedIn, type Client } from '../support/http';
import { demoUsers } from '../support/server';

const db = testDb();
let partner: Client;
let mapleId: string;
let birchId: string;
// The reference scenario in a farm of this file's own, whose units the tests switch.
let owner: Client;
let ownFarmId: string;

beforeAll(async () => {
	let own: { owner: Client; farmId: string };
	[partner, mapleId, birchId, own] = await Promise.all([
		signedIn(demoUsers.partner),
		demoFarmId(db, 'Maple Coulee Farm'),
		demoFarmId(db, 'Birch Hollow Farm'),
		farmFromScenario(db, 'scenarios/reference.json', 'farm-data')
	]);
	({ owner, farmId: ownFarmId } = own);
});

async function setUnits(unitSystem: 'us' | 'metric') {
	const { farm } = await (await owner.fetch(`/api/v1/farms/${ownFarmId}`)).json();
	const { id: _id, ...settings } = farm;
	const response = await owner.json(`/api/v1/farms/${ownFarmId}`, 'PUT', {
		...settings,
		unitSystem
	});
	expect(response.status).toBe(200);
}

const dataPage = async (client: Client, farmId: string) => {
	const response = await client.fetch(`/farms/${farmId}/data`, {
		headers: { Accept: 'text/html' }
	});
	expect(response.status).toBe(200);
	return response.text();
};

describe('the farm data page', () => {
	it('shows the seeded demo farm to its members in US customary units', async () => {
		const page = await dataPage(partner, mapleId);
		expect(page).toContain('Area (ac)');
		expect(page).toMatch(/North Flat<\/td>\s*<td[^>]*>52\.0</);
	});

	it('shows a farm in the farm’s own units', async () => {
		await setUnits('metric');
		const metric = await dataPage(owner, ownFarmId);
		expect(metric).toContain('Area (ha)');
		// 52 ac × 0.40468564 ha/ac = 21.0 ha (NDSU metric card)
		expect(metric).toMatch(/North Flat<\/td>\s*<td[^>]*>21\.0</);
		expect(metric).toContain('t/ha');

		await setUnits('us');
		const us = await dataPage(owner, ownFarmId);
		expect(us).toContain('Area (ac)');
		expect(us).toMatch(/North Flat<\/td>\s*<td[^>]*>52\.0</);
	});

	it('is not found for someone who is not a member', async () => {
		const response = await partner.fetch(`/farms/${birchId}/data`, {
			headers: { Accept: 'text/html' }
		});
		expect(response.status).toBe(404);
	});
});
