// /api/v1/farms/[farmId]/price-sets: the plan file's price set schema, the farm's own crops and
// operations, one set a year, the plans that need a year, and refusals that leave the database as it was.
import { and, eq } from 'drizzle-orm';
import { beforeAll, describe, expect, it } from 'vitest';
import { auditLog, priceSets } from '../../src/lib/server/db/schema';
import { testDb } from '../support/db';
import { Client } from '../support/http';
import { farmSnapshot, importReferencePlan, ownFarm, reviewerOf } from './farm-setup-support';

const db = testDb();

// Invented prices of the plausible size for a Corn Belt farm (not a forecast).
const prices2026 = {
	year: 2026,
	cropPricesUsdPerUnit: { corn: 4.4, soybean: 10.6 },
	nitrogenUsdPerLb: 0.55,
	dieselUsdPerGallon: 3.6,
	labourUsdPerHour: 18,
	hayUsdPerBale: 65,
	seedPrices: { 'corn-seed': { usdPerThousandSeeds: 3.5 }, 'cereal-rye': { usdPerLb: 0.29 } }
};

let owner: Client;
let farmId: string;
let otherOwner: Client;
let otherFarmId: string;
let otherSetId: string;

const base = (farm = farmId) => `/api/v1/farms/${farm}/price-sets`;
type Stored = typeof prices2026 & { id: string; customRatesUsdPerAcre: Record<string, number> };

async function addSet(body: Record<string, unknown>, client = owner, farm = farmId) {
	const response = await client.json(base(farm), 'POST', body);
	expect(response.status, await response.clone().text()).toBe(201);
	return (await response.json()).priceSet as Stored;
}

const pathsOf = async (response: Response) =>
	((await response.json()).issues as { path: string }[]).map((issue) => issue.path);

beforeAll(async () => {
	[{ owner, farmId }, { owner: otherOwner, farmId: otherFarmId }] = await Promise.all([
		ownFarm('prices'),
		ownFarm('prices-other')
	]);
	otherSetId = (await addSet({ ...prices2026, year: 2030 }, otherOwner, otherFarmId)).id;
});

describe('an owner', () => {
	it('adds a year’s prices and reads them back, with an audit entry', async () => {
		const set = await addSet(prices2026);
		expect(set).toEqual({
			id: expect.stringMatching(/^[0-9a-f-]{36}$/),
			...prices2026,
			customRatesUsdPerAcre: {}
		});
		const one = await owner.fetch(`${base()}/${set.id}`);
		expect(one.status).toBe(200);
		expect((await one.json()).priceSet).toEqual(set);
		const { priceSets: listed } = await (await owner.fetch(base())).json();
		expect(listed).toEqual([set]);
		const audit = await db
			.select()
			.from(auditLog)
			.where(and(eq(auditLog.farmId, farmId), eq(auditLog.action, 'price-set.created')));
		expect(audit.map((row) => row.detail)).toEqual([{ priceSetId: set.id, year: 2026 }]);
	});

	it('changes only what the body gives; a map the body gives replaces the stored one', async () => {
		const set = await addSet({ ...prices2026, year: 2040 });
		const hay = await owner.json(`${base()}/${set.id}`, 'PATCH', { hayUsdPerBale: 72.5 });
		expect(hay.status).toBe(200);
		expect((await hay.json()).priceSet).toEqual({ ...set, hayUsdPerBale: 72.5 });
		const corn = await owner.json(`${base()}/${set.id}`, 'PATCH', {
			cropPricesUsdPerUnit: { corn: 4.1 }
		});
		expect((await corn.json()).priceSet).toMatchObject({
			cropPricesUsdPerUnit: { corn: 4.1 },
			hayUsdPerBale: 72.5,
			seedPrices: prices2026.seedPrices
		});
	});

	it('copies a year to the next; a second copy is refused with 409 on year, nothing saved', async () => {
		const set = await addSet({ ...prices2026, year: 2041 });
		const copy = await owner.fetch(`${base()}/${set.id}/copy`, { method: 'POST' });
		expect(copy.status).toBe(201);
		const copied = (await copy.json()).priceSet;
		expect(copied).toEqual({ ...set, id: expect.any(String), year: 2042 });
		expect(copied.id).not.toBe(set.id);

		const before = await farmSnapshot(db, farmId);
		const again = await owner.fetch(`${base()}/${set.id}/copy`, { method: 'POST' });
		expect(again.status).toBe(409);
		const body = await again.json();
		expect(body.issues).toEqual([{ path: 'year', message: body.message }]);
		expect(body.message).toContain('2042');
		expect(await farmSnapshot(db, farmId)).toEqual(before);
	});

	it('deletes a set no plan needs', async () => {
		const set = await addSet({ ...prices2026, year: 2050 });
		expect((await owner.fetch(`${base()}/${set.id}`, { method: 'DELETE' })).status).toBe(204);
		expect(await db.select().from(priceSets).where(eq(priceSets.id, set.id))).toEqual([]);
		expect((await owner.fetch(`${base()}/${set.id}`)).status).toBe(404);
	});
});

describe('refusals that change nothing', () => {
	const refusedPost = async (body: unknown) => {
		const before = await farmSnapshot(db, farmId);
		const response = await owner.json(base(), 'POST', body);
		expect(await farmSnapshot(db, farmId)).toEqual(before);
		return response;
	};

	it('a second set for a year: 409 on year naming the year, by POST and by PATCH', async () => {
		const post = await refusedPost({ ...prices2026, labourUsdPerHour: 20 });
		expect(post.status).toBe(409);
		const message = "The farm already has prices for 2026: change that year's set instead.";
		expect(await post.json()).toEqual({ message, issues: [{ path: 'year', message }] });
		const later = await addSet({ ...prices2026, year: 2043 });
		const before = await farmSnapshot(db, farmId);
		const patch = await owner.json(`${base()}/${later.id}`, 'PATCH', { year: 2026 });
		expect(patch.status).toBe(409);
		expect(await pathsOf(patch)).toEqual(['year']);
		expect(await farmSnapshot(db, farmId)).toEqual(before);
	});

	it('wrong types: 422 naming each path', async () => {
		const response = await refusedPost({
			...prices2026,
			year: 'next',
			nitrogenUsdPerLb: '0.55',
			cropPricesUsdPerUnit: { corn: true }
		});
		expect(response.status).toBe(422);
		expect((await response.json()).issues).toEqual(
			expect.arrayContaining([
				{ path: 'year', message: 'Enter the year as a number.' },
				{ path: 'nitrogenUsdPerLb', message: 'Enter the N price as a number.' },
				{ path: 'cropPricesUsdPerUnit.corn', message: 'Enter the crop price as a number.' }
			])
		);
	});

	it('negative prices and prices above the range: 422 with the range', async () => {
		const negative = await refusedPost({ ...prices2026, dieselUsdPerGallon: -3.6 });
		expect(negative.status).toBe(422);
		expect((await negative.json()).issues).toEqual([
			{ path: 'dieselUsdPerGallon', message: 'The diesel price must be at least $0 per gallon.' }
		]);
		const huge = await refusedPost({
			...prices2026,
			nitrogenUsdPerLb: 55,
			seedPrices: { 'corn-seed': { usdPerThousandSeeds: 350 } }
		});
		expect((await huge.json()).issues).toEqual([
			{ path: 'nitrogenUsdPerLb', message: 'The N price must be at most $20 per lb N.' },
			{
				path: 'seedPrices.corn-seed.usdPerThousandSeeds',
				message: 'The seed price must be at most $100 per 1,000 seeds.'
			}
		]);
	});

	it('a crop or operation the farm does not have, a seed with no price, a missing value: 422', async () => {
		const crop = await refusedPost({ ...prices2026, cropPricesUsdPerUnit: { sunflower: 21 } });
		expect(crop.status).toBe(422);
		expect((await crop.json()).issues).toEqual([
			{
				path: 'cropPricesUsdPerUnit.sunflower',
				message:
					'The farm has no crop "sunflower": add it on the crops page first, or leave its price out.'
			}
		]);
		const rate = await refusedPost({
			...prices2026,
			customRatesUsdPerAcre: { 'round-baling': 24 }
		});
		expect(await pathsOf(rate)).toEqual(['customRatesUsdPerAcre.round-baling']);
		const seed = await refusedPost({ ...prices2026, seedPrices: { 'corn-seed': {} } });
		expect(await pathsOf(seed)).toEqual(['seedPrices.corn-seed']);
		const { hayUsdPerBale: _, ...noHay } = prices2026;
		const missing = await refusedPost(noHay);
		expect(await pathsOf(missing)).toEqual(['hayUsdPerBale']);
		expect((await refusedPost('{"year": ')).status).toBe(400);
	});

	it('PATCH with bad values, an unknown crop or an id changes nothing', async () => {
		const set = await addSet({ ...prices2026, year: 2044 });
		const before = await farmSnapshot(db, farmId);
		for (const [body, path] of [
			[{ labourUsdPerHour: 501 }, 'labourUsdPerHour'],
			[{ year: 1900 }, 'year'],
			[{ cropPricesUsdPerUnit: { corn: 4, flax: 14 } }, 'cropPricesUsdPerUnit.flax'],
			[{ id: crypto.randomUUID() }, '(document)'],
			[[1, 2], '(document)']
		] as const) {
			const response = await owner.json(`${base()}/${set.id}`, 'PATCH', body);
			expect(response.status, JSON.stringify(body)).toBe(422);
			expect(await pathsOf(response)).toContain(path);
		}
		expect(await farmSnapshot(db, farmId)).toEqual(before);
	});
});

describe('ids that are not the farm’s', () => {
	it('another farm’s set through this farm’s URL, unknown and malformed ids: 404 for every method', async () => {
		const before = await farmSnapshot(db, otherFarmId);
		for (const id of [otherSetId, crypto.randomUUID(), 'not-a-uuid']) {
			const url = `${base()}/${id}`;
			expect((await owner.fetch(url)).status).toBe(404);
			expect((await owner.json(url, 'PATCH', { hayUsdPerBale: 1 })).status).toBe(404);
			expect((await owner.fetch(url, { method: 'DELETE' })).status).toBe(404);
			expect((await owner.fetch(`${url}/copy`, { method: 'POST' })).status).toBe(404);
		}
		expect((await owner.fetch(base(otherFarmId))).status).toBe(404);
		expect((await owner.json(base(otherFarmId), 'POST', prices2026)).status).toBe(404);
		expect(await farmSnapshot(db, otherFarmId)).toEqual(before);
	});
});

describe('who may', () => {
	it('signed out: 401 for every route and method', async () => {
		const anonymous = new Client();
		const url = `${base(otherFarmId)}/${otherSetId}`;
		expect((await anonymous.fetch(base(otherFarmId))).status).toBe(401);
		expect((await anonymous.json(base(otherFarmId), 'POST', prices2026)).status).toBe(401);
		expect((await anonymous.fetch(url)).status).toBe(401);
		expect((await anonymous.json(url, 'PATCH', { hayUsdPerBale: 1 })).status).toBe(401);
		expect((await anonymous.fetch(url, { method: 'DELETE' })).status).toBe(401);
		expect((await anonymous.fetch(`${url}/copy`, { method: 'POST' })).status).toBe(401);
	});

	it('a reviewer reads the sets but gets 403 for adding, changing, copying and deleting', async () => {
		const reviewer = await reviewerOf(db, otherFarmId, 'prices-reviewer');
		const before = await farmSnapshot(db, otherFarmId);
		const url = `${base(otherFarmId)}/${otherSetId}`;
		expect((await reviewer.fetch(base(otherFarmId))).status).toBe(200);
		expect((await reviewer.fetch(url)).status).toBe(200);
		const post = await reviewer.json(base(otherFarmId), 'POST', { ...prices2026, year: 2031 });
		expect(post.status).toBe(403);
		expect((await post.json()).message).toBe('A reviewer of this farm may not do this.');
		expect((await reviewer.json(url, 'PATCH', { hayUsdPerBale: 1 })).status).toBe(403);
		expect((await reviewer.fetch(url, { method: 'DELETE' })).status).toBe(403);
		expect((await reviewer.fetch(`${url}/copy`, { method: 'POST' })).status).toBe(403);
		expect(await farmSnapshot(db, otherFarmId)).toEqual(before);
	});
});

describe('a year a saved plan needs', () => {
	it('is not deleted: 409 naming the plan; the year after the plan’s last is deleted', async () => {
		const { owner: planner, farmId: planFarm } = await ownFarm('prices-plan');
		const doc = await importReferencePlan(db, planFarm);
		const { startYear, years } = doc.plan.horizon;
		const { priceSets: stored } = await (await planner.fetch(base(planFarm))).json();
		const last = stored.find((set: Stored) => set.year === startYear + years - 1);
		// The file's own prices, operations and crops round-trip: its custom baling rate is the farm's.
		expect(last.customRatesUsdPerAcre).toEqual(
			doc.priceSets.find((set) => set.year === last.year)!.customRatesUsdPerAcre
		);

		const before = await farmSnapshot(db, planFarm);
		const refused = await planner.fetch(`${base(planFarm)}/${last.id}`, { method: 'DELETE' });
		expect(refused.status).toBe(409);
		const body = await refused.json();
		expect(body.plans).toEqual([doc.plan.name]);
		expect(body.message).toContain(`"${doc.plan.name}"`);
		expect(body.message).toContain(String(last.year));
		expect(await farmSnapshot(db, planFarm)).toEqual(before);

		const copy = await planner.fetch(`${base(planFarm)}/${last.id}/copy`, { method: 'POST' });
		const after = (await copy.json()).priceSet;
		expect(after.year).toBe(startYear + years);
		const gone = await planner.fetch(`${base(planFarm)}/${after.id}`, { method: 'DELETE' });
		expect(gone.status).toBe(204);
	});
});
