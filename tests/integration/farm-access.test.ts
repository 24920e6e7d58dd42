import { eq, inArray } from 'drizzle-orm';
import { beforeAll, describe, expect, it } from 'vitest';
import { farms, memberships, users } from '../../src/lib/server/db/schema';
import { testDb } from '../support/db';
import { addMember, createFarm, demoFarmId } from '../support/farms';
import { registerUser, signedIn, type Client } from '../support/http';
import { demoUsers } from '../support/server';

const db = testDb();
const months = Array(12).fill(200);
const validSettings = {
	name: 'Access Test Farm',
	region: 'Upper Midwest',
	unitSystem: 'us',
	labourHoursAvailableByMonth: months,
	interestRatePercent: 6
};

let owner: Client;
let lender: Client;
let mapleId: string;
let birchId: string;
// A farm of this file's own, for the edits: a new owner, and a second new person as its editor.
let farmOwner: Client;
let editor: Client;
let ownFarmId: string;

beforeAll(async () => {
	let editorEmail: string;
	[owner, lender, farmOwner, { client: editor, email: editorEmail }, mapleId, birchId] =
		await Promise.all([
			signedIn(demoUsers.owner),
			signedIn(demoUsers.lender),
			registerUser('farm-owner').then((user) => user.client),
			registerUser('farm-editor'),
			demoFarmId(db, 'Maple Coulee Farm'),
			demoFarmId(db, 'Birch Hollow Farm')
		]);
	ownFarmId = await createFarm(farmOwner, validSettings);
	await addMember(db, ownFarmId, editorEmail, 'editor');
});

const farmRow = (id: string) => db.query.farms.findFirst({ where: eq(farms.id, id) });

describe('a non-member', () => {
	it('gets 404 for another farm’s page and API, as if it did not exist', async () => {
		const page = await owner.fetch(`/farms/${birchId}`, { headers: { Accept: 'text/html' } });
		expect(page.status).toBe(404);
		expect(await page.text()).not.toContain('Birch Hollow');
		const api = await owner.fetch(`/api/v1/farms/${birchId}`);
		expect(api.status).toBe(404);
		const missing = await owner.fetch(`/api/v1/farms/${crypto.randomUUID()}`);
		expect(missing.status).toBe(404);
		// The same answer as for a farm that does not exist: no hint that it does.
		expect(await api.json()).toEqual(await missing.json());
		expect((await owner.fetch('/api/v1/farms/not-a-uuid')).status).toBe(404);
	});

	it('cannot change another farm through the API', async () => {
		const before = await farmRow(birchId);
		const response = await owner.json(`/api/v1/farms/${birchId}`, 'PUT', {
			...validSettings,
			name: 'Taken'
		});
		expect(response.status).toBe(404);
		expect(await farmRow(birchId)).toEqual(before);
	});
});

describe('a reviewer (the lender)', () => {
	it('can read the farm', async () => {
		const page = await lender.fetch(`/farms/${mapleId}`, { headers: { Accept: 'text/html' } });
		expect(page.status).toBe(200);
		expect(await page.text()).toContain('Maple Coulee Farm');
		const api = await lender.fetch(`/api/v1/farms/${mapleId}`);
		expect(api.status).toBe(200);
		expect((await api.json()).role).toBe('reviewer');
	});

	it('is refused (403) on every edit route and nothing changes', async () => {
		const before = await farmRow(mapleId);
		const page = await lender.fetch(`/farms/${mapleId}/settings`, {
			headers: { Accept: 'text/html' }
		});
		expect(page.status).toBe(403);
		const action = await lender.postForm(`/farms/${mapleId}/settings`, {
			name: 'Renamed by reviewer',
			unitSystem: 'us',
			labourHours: months.map(String),
			interestRatePercent: '6'
		});
		expect(action.status).toBe(403);
		const api = await lender.json(`/api/v1/farms/${mapleId}`, 'PUT', {
			...validSettings,
			name: 'Renamed'
		});
		expect(api.status).toBe(403);
		expect(await farmRow(mapleId)).toEqual(before);
	});
});

describe('an editor', () => {
	it('saves farm settings through the form and the API', async () => {
		const saved = await editor.postForm(`/farms/${ownFarmId}/settings`, {
			name: 'Access Test Farm',
			region: 'Upper Midwest, east coulee',
			unitSystem: 'us',
			labourHours: months.map(String),
			interestRatePercent: '6.5'
		});
		expect(saved.status).toBe(303);
		expect((await farmRow(ownFarmId))?.region).toBe('Upper Midwest, east coulee');
		const api = await editor.json(`/api/v1/farms/${ownFarmId}`, 'PUT', validSettings);
		expect(api.status).toBe(200);
		const row = await farmRow(ownFarmId);
		expect([row?.region, row?.interestRatePercent]).toEqual(['Upper Midwest', 6]);
	});

	it('gets field-named messages for bad settings, and nothing is saved', async () => {
		const before = await farmRow(ownFarmId);
		const form = await editor.postForm(`/farms/${ownFarmId}/settings`, {
			name: '',
			unitSystem: 'furlongs',
			labourHours: ['200', '-5', ...months.slice(2).map(String)],
			interestRatePercent: 'lots'
		});
		expect(form.status).toBe(400);
		const html = await form.text();
		expect(html).toContain('Enter the farm name.');
		expect(html).toContain('Labour hours in a month must be at least 0 hours.');
		expect(html).toContain('Enter the rate as a number.');
		const api = await editor.json(`/api/v1/farms/${ownFarmId}`, 'PUT', {
			...validSettings,
			labourHoursAvailableByMonth: [1, 2, 3]
		});
		expect(api.status).toBe(422);
		expect((await api.json()).issues).toEqual([
			{
				path: 'labourHoursAvailableByMonth',
				message: 'Give labour hours for all 12 months, January to December.'
			}
		]);
		expect(await farmRow(ownFarmId)).toEqual(before);
	});
});

describe('POST /api/v1/farms', () => {
	it('creates a farm with the caller as owner', async () => {
		const response = await farmOwner.json('/api/v1/farms', 'POST', {
			...validSettings,
			name: 'Lender Test Plot'
		});
		expect(response.status).toBe(201);
		const { farm } = await response.json();
		expect(farm).toMatchObject({ name: 'Lender Test Plot', role: 'owner' });
		const member = await db.query.memberships.findFirst({ where: eq(memberships.farmId, farm.id) });
		expect(member?.role).toBe('owner');
	});

	it('answers 422 naming each bad field, 400 for a body that is not JSON, and saves nothing', async () => {
		// A new account of its own: any farm it gets would be the refused one (other files make farms
		// of their own meanwhile, so a count of all farms could not tell).
		const { client: newcomer, email } = await registerUser('farm-refused');
		const farmsOfNewcomer = () =>
			db.$count(
				memberships,
				inArray(
					memberships.userId,
					db.select({ id: users.id }).from(users).where(eq(users.email, email))
				)
			);
		const invalid = await newcomer.json('/api/v1/farms', 'POST', { name: '  ', unitSystem: 'us' });
		expect(invalid.status).toBe(422);
		const { issues } = await invalid.json();
		expect(issues.map((i: { path: string }) => i.path).sort()).toEqual([
			'interestRatePercent',
			'labourHoursAvailableByMonth',
			'name'
		]);
		const notJson = await newcomer.json('/api/v1/farms', 'POST', '{"name": ');
		expect(notJson.status).toBe(400);
		expect(await farmsOfNewcomer()).toBe(0);
	});
});
