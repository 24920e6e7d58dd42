import { beforeAll, describe, expect, it } from 'vitest';
import { signedIn, type Client } from '../support/http';
import { demoUsers } from '../support/server';

let partner: Client;
let mapleId: string;
let birchId: string;

beforeAll(async () => {
	partner = await signedIn(demoUsers.partner);
	const lender = await signedIn(demoUsers.lender);
	const { farms } = await (await lender.fetch('/api/v1/farms')).json();
	mapleId = farms.find((f: { name: string }) => f.name === 'Maple Coulee Farm').id;
	birchId = farms.find((f: { name: string }) => f.name === 'Birch Hollow Farm').id;
});

async function setUnits(unitSystem: 'us' | 'metric') {
	const { farm } = await (await partner.fetch(`/api/v1/farms/${mapleId}`)).json();
	const { id: _id, ...settings } = farm;
	const response = await partner.json(`/api/v1/farms/${mapleId}`, 'PUT', {
		...settings,
		unitSystem
	});
	expect(response.status).toBe(200);
}

const dataPage = async () => {
	const response = await partner.fetch(`/farms/${mapleId}/data`, {
		headers: { Accept: 'text/html' }
	});
	expect(response.status).toBe(200);
	return response.text();
};

describe('the farm data page', () => {
	it('shows the seeded demo farm in the farm’s own units', async () => {
		await setUnits('us');
		const us = await dataPage();
		expect(us).toContain('Area (ac)');
		expect(us).toMatch(/North Flat<\/td>\s*<td[^>]*>52\.0</);

		await setUnits('metric');
		const metric = await dataPage();
		expect(metric).toContain('Area (ha)');
		// 52 ac × 0.40468564 ha/ac = 21.0 ha (NDSU metric card)
		expect(metric).toMatch(/North Flat<\/td>\s*<td[^>]*>21\.0</);
		expect(metric).toContain('t/ha');
		await setUnits('us');
	});

	it('is not found for someone who is not a member', async () => {
		const response = await partner.fetch(`/farms/${birchId}/data`, {
			headers: { Accept: 'text/html' }
		});
		expect(response.status).toBe(404);
	});
});
