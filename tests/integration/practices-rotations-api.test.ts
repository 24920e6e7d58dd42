// /api/v1/farms/[farmId]/practices and /rotations: the plan file's practice and rotation schemas and
// its cross-checks, the farm guards, refusals that leave the database exactly as it was, and 409s for
// a practice a rotation grows or a rotation a plan uses.
import { eq } from 'drizzle-orm';
import { beforeAll, describe, expect, it } from 'vitest';
import { practiceOperations, rotationSteps } from '../../src/lib/server/db/schema';
import { testDb } from '../support/db';
import { Client } from '../support/http';
import { farmSnapshot, importReferencePlan, ownFarm, reviewerOf } from './farm-setup-support';

const db = testDb();

// The wide-row corn of scenarios/wide-row-interseeded.json, less its id; the reference plan's farm
// has every operation it names.
const wideRowCorn = {
	name: 'No-till corn, 60-in rows, interseeded mix',
	crop: 'corn',
	yieldGoalPerAcre: 195,
	yieldAdjustmentPercent: -3,
	rowSpacingIn: 60,
	seed: { seedId: 'corn-seed', seedsPerAcre: 34000 },
	nitrogen: {
		appliedLbPerAcre: 170,
		response: { interceptBuPerAcre: 115, linearBuPerLbN: 0.85, quadraticBuPerLbN2: 0.0025 }
	},
	otherFertiliserUsdPerAcre: 45,
	chemicalsUsdPerAcre: 38,
	operations: [
		{ operationId: 'nh3-applicator' },
		{ operationId: 'wide-row-planter' },
		{ operationId: 'interseeder', month: 7 },
		{ operationId: 'combine-corn' }
	],
	coverMix: {
		species: [
			{ seedId: 'annual-ryegrass', lbPerAcre: 12 },
			{ seedId: 'crimson-clover', lbPerAcre: 8 }
		],
		biomassLbDmPerAcre: 900,
		legumeSharePercent: 25,
		grazingUtilisationPercent: 50
	},
	residueGrazing: { utilisationPercent: 50 }
};

let owner: Client;
let farmId: string;
let planName: string;
let otherOwner: Client;
let otherFarmId: string;
let otherPracticeId: string;
let otherRotationId: string;

const practicesUrl = (farm = farmId) => `/api/v1/farms/${farm}/practices`;
const rotationsUrl = (farm = farmId) => `/api/v1/farms/${farm}/rotations`;
type Practice = Record<string, unknown> & { id: string; key: string };
type Rotation = { id: string; key: string; name: string; practices: { key: string; id: string }[] };

async function addPractice(
	body: Record<string, unknown> = wideRowCorn,
	client = owner,
	farm = farmId
) {
	const response = await client.json(practicesUrl(farm), 'POST', body);
	expect(response.status, await response.clone().text()).toBe(201);
	return (await response.json()).practice as Practice;
}

async function addRotation(body: Record<string, unknown>, client = owner, farm = farmId) {
	const response = await client.json(rotationsUrl(farm), 'POST', body);
	expect(response.status, await response.clone().text()).toBe(201);
	return (await response.json()).rotation as Rotation;
}

beforeAll(async () => {
	[{ owner, farmId }, { owner: otherOwner, farmId: otherFarmId }] = await Promise.all([
		ownFarm('practices'),
		ownFarm('practices-other')
	]);
	const [doc] = await Promise.all([
		importReferencePlan(db, farmId),
		importReferencePlan(db, otherFarmId)
	]);
	planName = doc.plan.name;
	otherPracticeId = (await addPractice(wideRowCorn, otherOwner, otherFarmId)).id;
	otherRotationId = (
		await addRotation({ name: 'Other', practices: ['soybean-15in'] }, otherOwner, otherFarmId)
	).id;
});

describe('practices', () => {
	it('adds a practice with its operations in order, by key, and the schema’s defaults', async () => {
		const practice = await addPractice();
		expect(practice).toMatchObject({
			id: expect.stringMatching(/^[0-9a-f-]{36}$/),
			key: 'no-till-corn-60-in-rows-interseeded-mix',
			name: wideRowCorn.name,
			crop: 'corn',
			otherDirectUsdPerAcre: 0,
			operatingInterestMonths: 6,
			operations: [
				{ operationId: 'nh3-applicator', passes: 1 },
				{ operationId: 'wide-row-planter', passes: 1 },
				{ operationId: 'interseeder', month: 7, passes: 1 },
				{ operationId: 'combine-corn', passes: 1 }
			],
			// SARE MCCP defaults the plan file states: legume 3.5 % N, half available.
			coverMix: { legumeNitrogenPercent: 3.5, nitrogenAvailablePercent: 50 },
			// Left out, the leaf and husk is corn's own: 16 lb DM per bushel (UNL, Rasby 2007).
			residueGrazing: { utilisationPercent: 50, leafHuskLbDmPerUnit: 16 }
		});
		const steps = await db
			.select()
			.from(practiceOperations)
			.where(eq(practiceOperations.practiceId, practice.id));
		expect(steps.map((s) => s.sequence).sort()).toEqual([1, 2, 3, 4]);
		const read = await owner.fetch(`${practicesUrl()}/${practice.id}`);
		expect((await read.json()).practice).toEqual(practice);
		const { practices } = await (await owner.fetch(practicesUrl())).json();
		expect(practices).toContainEqual(practice);
		expect(practices.map((p: Practice) => p.key)).toContain('corn-30in-full-n');
	});

	it('changes only what the body gives; a new operations list replaces the old', async () => {
		const practice = await addPractice({ ...wideRowCorn, name: 'Patch corn' });
		const patched = await owner.json(`${practicesUrl()}/${practice.id}`, 'PATCH', {
			yieldGoalPerAcre: 180,
			operations: [{ operationId: 'combine-corn' }, { operationId: 'sprayer', passes: 2 }]
		});
		expect(patched.status).toBe(200);
		expect((await patched.json()).practice).toEqual({
			...practice,
			yieldGoalPerAcre: 180,
			operations: [
				{ operationId: 'combine-corn', passes: 1 },
				{ operationId: 'sprayer', passes: 2 }
			]
		});
	});

	it('deletes a practice no rotation grows, with its operations', async () => {
		const practice = await addPractice({ ...wideRowCorn, name: 'Gone soon' });
		const response = await owner.fetch(`${practicesUrl()}/${practice.id}`, { method: 'DELETE' });
		expect(response.status).toBe(204);
		expect((await owner.fetch(`${practicesUrl()}/${practice.id}`)).status).toBe(404);
		const steps = await db
			.select()
			.from(practiceOperations)
			.where(eq(practiceOperations.practiceId, practice.id));
		expect(steps).toEqual([]);
	});
});

describe('rotations', () => {
	it('adds a rotation naming practices by key and answers with keys and row ids', async () => {
		const corn = await addPractice({ ...wideRowCorn, name: 'Rotation corn' });
		const rotation = await addRotation({
			name: 'Wide corn – soybean',
			practices: [corn.key, 'soybean-15in']
		});
		const { practices } = await (await owner.fetch(practicesUrl())).json();
		const soybean = practices.find((p: Practice) => p.key === 'soybean-15in');
		expect(rotation).toEqual({
			id: expect.stringMatching(/^[0-9a-f-]{36}$/),
			key: 'wide-corn-soybean',
			name: 'Wide corn – soybean',
			practices: [
				{ key: corn.key, id: corn.id },
				{ key: 'soybean-15in', id: soybean.id }
			]
		});
		const steps = await db
			.select()
			.from(rotationSteps)
			.where(eq(rotationSteps.rotationId, rotation.id));
		expect(steps).toHaveLength(2);
		expect((await (await owner.fetch(`${rotationsUrl()}/${rotation.id}`)).json()).rotation).toEqual(
			rotation
		);
		const { rotations } = await (await owner.fetch(rotationsUrl())).json();
		expect(rotations).toContainEqual(rotation);
	});

	it('changes the years, then deletes a rotation no plan uses', async () => {
		const rotation = await addRotation({ name: 'Short lived', practices: ['soybean-15in'] });
		const patched = await owner.json(`${rotationsUrl()}/${rotation.id}`, 'PATCH', {
			practices: ['corn-30in-full-n', 'soybean-15in', 'soybean-15in']
		});
		expect(patched.status).toBe(200);
		const body = (await patched.json()).rotation as Rotation;
		expect(body.practices.map((p) => p.key)).toEqual([
			'corn-30in-full-n',
			'soybean-15in',
			'soybean-15in'
		]);
		expect(body.name).toBe('Short lived');
		const gone = await owner.fetch(`${rotationsUrl()}/${rotation.id}`, { method: 'DELETE' });
		expect(gone.status).toBe(204);
		expect((await owner.fetch(`${rotationsUrl()}/${rotation.id}`)).status).toBe(404);
	});
});

describe('bad bodies: 422 with the path, nothing saved', () => {
	const refused = async (url: string, method: string, body: unknown) => {
		const before = await farmSnapshot(db, farmId);
		const response = await owner.json(url, method, body);
		expect(await farmSnapshot(db, farmId)).toEqual(before);
		expect(response.status, JSON.stringify(body)).toBe(422);
		return (await response.json()).issues as { path: string; message: string }[];
	};

	it('practices: unknown crop or operation, N curve rules, ranges', async () => {
		const cases: [Record<string, unknown>, string, RegExp][] = [
			[{ crop: 'sorghum' }, 'crop', /Unknown crop "sorghum"/],
			[
				{ operations: [{ operationId: 'plough' }] },
				'operations.0.operationId',
				/Unknown operation "plough"/
			],
			[{ crop: 'soybean' }, 'nitrogen.response', /Soybean is a legume/],
			[
				{ crop: 'oat-pea-forage', yieldGoalPerAcre: 3, residueGrazing: null },
				'nitrogen.response',
				/in bu\/ac: Oat–pea forage is sold by the ton/
			],
			[
				{ nitrogen: { appliedLbPerAcre: 'economic-optimum' } },
				'nitrogen.appliedLbPerAcre',
				/economic-optimum rate needs a nitrogen response curve/
			],
			[{ yieldGoalPerAcre: -1 }, 'yieldGoalPerAcre', /at least 0/],
			[{ nitrogen: { appliedLbPerAcre: 900 } }, 'nitrogen.appliedLbPerAcre', /500 lb N per acre/]
		];
		for (const [change, path, message] of cases) {
			const issues = await refused(practicesUrl(), 'POST', { ...wideRowCorn, ...change });
			expect(issues, JSON.stringify(change)).toContainEqual({
				path,
				message: expect.stringMatching(message)
			});
		}
	});

	it('practices: a key another practice has, a body that is not an object, a bad PATCH', async () => {
		expect(await refused(practicesUrl(), 'POST', { ...wideRowCorn, key: 'soybean-15in' })).toEqual([
			{
				path: 'key',
				message: 'Another practice of this farm has the key "soybean-15in": choose another.'
			}
		]);
		expect((await refused(practicesUrl(), 'POST', [wideRowCorn]))[0].path).toBe('(document)');
		const practice = await addPractice({ ...wideRowCorn, name: 'Patched badly' });
		const url = `${practicesUrl()}/${practice.id}`;
		expect((await refused(url, 'PATCH', { crop: 'soybean' }))[0].path).toBe('nitrogen.response');
		expect((await refused(url, 'PATCH', { colour: 'green' }))[0].path).toBe('(document)');
	});

	it('rotations: 0 or 9 years, an unknown practice, a bad PATCH', async () => {
		const yearsMessage = 'Give at least one practice: a rotation is 1 to 8 years.';
		expect(await refused(rotationsUrl(), 'POST', { name: 'Empty', practices: [] })).toEqual([
			{ path: 'practices', message: yearsMessage }
		]);
		const nine = Array(9).fill('soybean-15in');
		expect(await refused(rotationsUrl(), 'POST', { name: 'Long', practices: nine })).toEqual([
			{ path: 'practices', message: 'Give at most 8 practices.' }
		]);
		const unknown = { name: 'Odd', practices: ['soybean-15in', 'sorghum-wide'] };
		expect(await refused(rotationsUrl(), 'POST', unknown)).toEqual([
			{ path: 'practices.1', message: 'Unknown practice "sorghum-wide"' }
		]);
		const rotation = await addRotation({ name: 'Patch target', practices: ['soybean-15in'] });
		const url = `${rotationsUrl()}/${rotation.id}`;
		expect((await refused(url, 'PATCH', { practices: [] }))[0].path).toBe('practices');
		expect((await refused(url, 'PATCH', { key: 'corn-soybean' }))[0].path).toBe('key');
	});
});

describe('ids that are not the farm’s', () => {
	it('another farm’s practice and rotation through this farm’s URL: 404, and they stay', async () => {
		const before = await farmSnapshot(db, otherFarmId);
		for (const url of [
			`${practicesUrl()}/${otherPracticeId}`,
			`${rotationsUrl()}/${otherRotationId}`
		]) {
			expect((await owner.fetch(url)).status).toBe(404);
			expect((await owner.json(url, 'PATCH', { name: 'Mine now' })).status).toBe(404);
			expect((await owner.fetch(url, { method: 'DELETE' })).status).toBe(404);
		}
		expect(await farmSnapshot(db, otherFarmId)).toEqual(before);
	});

	it('unknown and malformed ids: 404', async () => {
		for (const base of [practicesUrl(), rotationsUrl()]) {
			for (const id of [crypto.randomUUID(), 'not-a-uuid']) {
				expect((await owner.fetch(`${base}/${id}`)).status).toBe(404);
				expect((await owner.json(`${base}/${id}`, 'PATCH', { name: 'x' })).status).toBe(404);
				expect((await owner.fetch(`${base}/${id}`, { method: 'DELETE' })).status).toBe(404);
			}
		}
	});

	it('a farm the user is not a member of: 404 for the lists and adding', async () => {
		const before = await farmSnapshot(db, otherFarmId);
		expect((await owner.fetch(practicesUrl(otherFarmId))).status).toBe(404);
		expect((await owner.json(practicesUrl(otherFarmId), 'POST', wideRowCorn)).status).toBe(404);
		expect((await owner.fetch(rotationsUrl(otherFarmId))).status).toBe(404);
		const rotation = { name: 'Sneaky', practices: ['soybean-15in'] };
		expect((await owner.json(rotationsUrl(otherFarmId), 'POST', rotation)).status).toBe(404);
		expect(await farmSnapshot(db, otherFarmId)).toEqual(before);
	});
});

describe('who may', () => {
	it('signed out: 401 for every route and method', async () => {
		const anonymous = new Client();
		for (const [list, one] of [
			[practicesUrl(), `${practicesUrl()}/${otherPracticeId}`],
			[rotationsUrl(), `${rotationsUrl()}/${otherRotationId}`]
		]) {
			expect((await anonymous.fetch(list)).status).toBe(401);
			expect((await anonymous.json(list, 'POST', {})).status).toBe(401);
			expect((await anonymous.fetch(one)).status).toBe(401);
			expect((await anonymous.json(one, 'PATCH', {})).status).toBe(401);
			expect((await anonymous.fetch(one, { method: 'DELETE' })).status).toBe(401);
		}
	});

	it('a reviewer reads practices and rotations but gets 403 for adding, changing and deleting', async () => {
		const practice = await addPractice({ ...wideRowCorn, name: 'Reviewed corn' });
		const rotation = await addRotation({ name: 'Reviewed', practices: [practice.key] });
		const reviewer = await reviewerOf(db, farmId, 'practices-reviewer');
		const before = await farmSnapshot(db, farmId);
		for (const [list, one, body] of [
			[practicesUrl(), `${practicesUrl()}/${practice.id}`, wideRowCorn],
			[
				rotationsUrl(),
				`${rotationsUrl()}/${rotation.id}`,
				{ name: 'R', practices: ['soybean-15in'] }
			]
		] as const) {
			expect((await reviewer.fetch(list)).status).toBe(200);
			expect((await reviewer.fetch(one)).status).toBe(200);
			const post = await reviewer.json(list, 'POST', body);
			expect(post.status).toBe(403);
			expect((await post.json()).message).toBe('A reviewer of this farm may not do this.');
			expect((await reviewer.json(one, 'PATCH', { name: 'Changed' })).status).toBe(403);
			expect((await reviewer.fetch(one, { method: 'DELETE' })).status).toBe(403);
		}
		expect(await farmSnapshot(db, farmId)).toEqual(before);
	});
});

describe('what is in use', () => {
	it('a practice a rotation grows is not deleted: 409 naming the rotation', async () => {
		const { practices } = await (await owner.fetch(practicesUrl())).json();
		const corn = practices.find((p: Practice) => p.key === 'corn-30in-full-n');
		const before = await farmSnapshot(db, farmId);
		const response = await owner.fetch(`${practicesUrl()}/${corn.id}`, { method: 'DELETE' });
		expect(response.status).toBe(409);
		const body = await response.json();
		expect(body.rotations).toEqual(['Corn–soybean']);
		expect(body.message).toBe(
			'No-till corn, 30-in rows, full N is a year of the rotation "Corn–soybean": take it out of that rotation before deleting it.'
		);
		expect(await farmSnapshot(db, farmId)).toEqual(before);
	});

	it('a rotation a plan version uses is not deleted: 409 naming the plan', async () => {
		const { rotations } = await (await owner.fetch(rotationsUrl())).json();
		const cornSoybean = rotations.find((r: Rotation) => r.key === 'corn-soybean');
		const before = await farmSnapshot(db, farmId);
		const response = await owner.fetch(`${rotationsUrl()}/${cornSoybean.id}`, {
			method: 'DELETE'
		});
		expect(response.status).toBe(409);
		const body = await response.json();
		expect(body.plans).toEqual([planName]);
		expect(body.message).toContain(`"${planName}"`);
		expect(await farmSnapshot(db, farmId)).toEqual(before);
	});
});
