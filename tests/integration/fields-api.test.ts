// /api/v1/farms/[farmId]/fields: the plan file's field schema, the farm guards, and refusals that leave
// the database exactly as it was.
import { and, eq } from 'drizzle-orm';
import { beforeAll, describe, expect, it } from 'vitest';
import { fields, planFieldAssignments } from '../../src/lib/server/db/schema';
import { testDb } from '../support/db';
import { Client, signedIn } from '../support/http';
import { demoUsers } from '../support/server';
import { farmSnapshot, importReferencePlan, ownFarm, reviewerOf } from './farm-setup-support';

const db = testDb();
const northForty = {
	name: 'North Forty',
	acres: 40.5,
	productivityIndex: 1.05,
	priorCrop: 'soybean',
	notes: 'Tile drained in the east half.'
};

let owner: Client;
let farmId: string;
let otherOwner: Client;
let otherFarmId: string;
let otherFieldId: string;

const base = (farm = farmId) => `/api/v1/farms/${farm}/fields`;

async function addField(body: Record<string, unknown> = northForty, client = owner, farm = farmId) {
	const response = await client.json(base(farm), 'POST', body);
	expect(response.status).toBe(201);
	return (await response.json()).field as Record<string, unknown> & { id: string; key: string };
}

beforeAll(async () => {
	[{ owner, farmId }, { owner: otherOwner, farmId: otherFarmId }] = await Promise.all([
		ownFarm('fields'),
		ownFarm('fields-other')
	]);
	otherFieldId = (await addField({ name: 'Other Farm Field', acres: 12 }, otherOwner, otherFarmId))
		.id;
});

describe('an owner', () => {
	it('adds a field and gets it back with its row id, a key made from the name and the defaults', async () => {
		const field = await addField({ name: 'Creek Bottom', acres: 22 });
		expect(field).toEqual({
			id: expect.stringMatching(/^[0-9a-f-]{36}$/),
			key: 'creek-bottom',
			name: 'Creek Bottom',
			acres: 22,
			productivityIndex: 1,
			priorCrop: '',
			priorCropNitrogenCreditLbPerAcre: 0,
			tenure: 'owned',
			cashRentUsdPerAcre: 0,
			notes: ''
		});
		const [row] = await db.select().from(fields).where(eq(fields.id, field.id));
		expect(row).toMatchObject({ farmId, key: 'creek-bottom', acres: 22 });
		const read = await owner.fetch(`${base()}/${field.id}`);
		expect(read.status).toBe(200);
		expect((await read.json()).field).toEqual(field);
	});

	it('gets a key of its own for a second field of the same name, and keeps a key it gives', async () => {
		const first = await addField({ name: 'Home Quarter', acres: 160 });
		const second = await addField({ name: 'Home Quarter', acres: 80 });
		expect([first.key, second.key]).toEqual(['home-quarter', 'home-quarter-2']);
		const named = await addField({ name: 'Hill 9', acres: 9, key: 'the-hill' });
		expect(named.key).toBe('the-hill');
	});

	it('lists the farm’s fields by name', async () => {
		const field = await addField(northForty);
		const response = await owner.fetch(base());
		expect(response.status).toBe(200);
		const { fields: listed } = await response.json();
		expect(listed).toContainEqual({
			...northForty,
			id: field.id,
			key: field.key,
			priorCropNitrogenCreditLbPerAcre: 0,
			tenure: 'owned',
			cashRentUsdPerAcre: 0
		});
		const names = listed.map((f: { name: string }) => f.name);
		expect(names).toEqual([...names].sort((a: string, b: string) => a.localeCompare(b)));
		expect(names).not.toContain('Other Farm Field');
	});

	it('changes only what the body gives', async () => {
		const field = await addField(northForty);
		const response = await owner.json(`${base()}/${field.id}`, 'PATCH', { acres: 38.25 });
		expect(response.status).toBe(200);
		expect((await response.json()).field).toEqual({ ...field, acres: 38.25 });
		const [row] = await db.select().from(fields).where(eq(fields.id, field.id));
		expect(row).toMatchObject({ acres: 38.25, name: 'North Forty', notes: northForty.notes });
	});

	it('rents a field for cash, and takes the rent away when it is bought', async () => {
		const field = await addField({
			name: 'Widow Lane Eighty',
			acres: 80,
			tenure: 'cash-rented',
			cashRentUsdPerAcre: 232.5
		});
		expect(field).toMatchObject({ tenure: 'cash-rented', cashRentUsdPerAcre: 232.5 });
		// bought: owned land pays no rent, so both change together
		const refused = await owner.json(`${base()}/${field.id}`, 'PATCH', { tenure: 'owned' });
		expect(refused.status).toBe(422);
		expect((await refused.json()).issues).toEqual([
			{
				path: 'cashRentUsdPerAcre',
				message: 'An owned field pays no cash rent: set the tenure to cash-rented or the rent to 0.'
			}
		]);
		const bought = await owner.json(`${base()}/${field.id}`, 'PATCH', {
			tenure: 'owned',
			cashRentUsdPerAcre: 0
		});
		expect((await bought.json()).field).toMatchObject({ tenure: 'owned', cashRentUsdPerAcre: 0 });
	});

	it('deletes a field no plan uses', async () => {
		const field = await addField({ name: 'Gone Soon', acres: 3 });
		const response = await owner.fetch(`${base()}/${field.id}`, { method: 'DELETE' });
		expect(response.status).toBe(204);
		expect(await db.select().from(fields).where(eq(fields.id, field.id))).toEqual([]);
		expect((await owner.fetch(`${base()}/${field.id}`)).status).toBe(404);
	});
});

describe('bad bodies', () => {
	const refusedPost = async (body: unknown) => {
		const before = await farmSnapshot(db, farmId);
		const response = await owner.json(base(), 'POST', body);
		expect(await farmSnapshot(db, farmId)).toEqual(before);
		return response;
	};
	const pathsOf = async (response: Response) =>
		((await response.json()).issues as { path: string }[]).map((issue) => issue.path);

	it('wrong types: 422 naming each path, nothing saved', async () => {
		const response = await refusedPost({ name: 5, acres: 'ten', productivityIndex: true });
		expect(response.status).toBe(422);
		const body = await response.json();
		expect(body.message).toBe('The input is not valid.');
		expect(body.issues).toEqual(
			expect.arrayContaining([
				{ path: 'name', message: 'Enter the field name as text.' },
				{ path: 'acres', message: 'Enter field area as a number.' },
				{ path: 'productivityIndex', message: 'Enter the productivity index as a number.' }
			])
		);
	});

	it('negative or too many acres: 422 with the range', async () => {
		const negative = await refusedPost({ ...northForty, acres: -5 });
		expect(negative.status).toBe(422);
		expect((await negative.json()).issues).toEqual([
			{ path: 'acres', message: 'Field area must be at least 0.01 acres.' }
		]);
		const huge = await refusedPost({ ...northForty, acres: 1e9 });
		expect((await huge.json()).issues).toEqual([
			{ path: 'acres', message: 'Field area must be at most 20,000 acres.' }
		]);
	});

	it('a missing name, an unknown key, a bad key: 422 for each', async () => {
		const response = await refusedPost({ acres: 10, colour: 'green', key: 'Not A Key' });
		expect(response.status).toBe(422);
		expect((await pathsOf(response)).sort()).toEqual(['(document)', 'key', 'name']);
	});

	it('a body that is not a field object: 422 (a list) or 400 (not JSON)', async () => {
		const list = await refusedPost([northForty]);
		expect(list.status).toBe(422);
		expect(await pathsOf(list)).toEqual(['(document)']);
		const notJson = await refusedPost('{"name": ');
		expect(notJson.status).toBe(400);
	});

	it('a key another field has: 422 on key, nothing saved', async () => {
		await addField({ name: 'Keyed', acres: 5, key: 'keyed' });
		const response = await refusedPost({ name: 'Keyed again', acres: 5, key: 'keyed' });
		expect(response.status).toBe(422);
		expect((await response.json()).issues).toEqual([
			{ path: 'key', message: 'Another field of this farm has the key "keyed": choose another.' }
		]);
	});

	it('PATCH with bad values or a taken key changes nothing', async () => {
		const field = await addField({ name: 'Patch Me', acres: 7 });
		await addField({ name: 'Taken Key', acres: 7, key: 'taken-key' });
		const before = await farmSnapshot(db, farmId);
		for (const [body, path] of [
			[{ acres: -1 }, 'acres'],
			[{ productivityIndex: 9 }, 'productivityIndex'],
			[{ tenure: 'share-rented' }, 'tenure'],
			[{ tenure: 'cash-rented', cashRentUsdPerAcre: 2001 }, 'cashRentUsdPerAcre'],
			[{ name: '' }, 'name'],
			[{ key: 'taken-key' }, 'key'],
			[{ id: crypto.randomUUID() }, '(document)'],
			['"just text"', '(document)']
		] as const) {
			const response = await owner.json(`${base()}/${field.id}`, 'PATCH', body);
			expect(response.status, JSON.stringify(body)).toBe(422);
			expect(await pathsOf(response)).toContain(path);
		}
		expect(await farmSnapshot(db, farmId)).toEqual(before);
	});
});

describe('ids that are not the farm’s', () => {
	it('another farm’s field through this farm’s URL: 404 for read, change and delete; it stays as it was', async () => {
		const before = await farmSnapshot(db, otherFarmId);
		const url = `${base()}/${otherFieldId}`;
		expect((await owner.fetch(url)).status).toBe(404);
		expect((await owner.json(url, 'PATCH', { acres: 1 })).status).toBe(404);
		expect((await owner.fetch(url, { method: 'DELETE' })).status).toBe(404);
		expect(await farmSnapshot(db, otherFarmId)).toEqual(before);
	});

	it('unknown and malformed field ids: 404', async () => {
		for (const id of [crypto.randomUUID(), 'not-a-uuid']) {
			expect((await owner.fetch(`${base()}/${id}`)).status).toBe(404);
			expect((await owner.json(`${base()}/${id}`, 'PATCH', { acres: 1 })).status).toBe(404);
			expect((await owner.fetch(`${base()}/${id}`, { method: 'DELETE' })).status).toBe(404);
		}
	});

	it('a farm the user is not a member of: 404 for every method, nothing saved there', async () => {
		const before = await farmSnapshot(db, otherFarmId);
		expect((await owner.fetch(base(otherFarmId))).status).toBe(404);
		expect((await owner.json(base(otherFarmId), 'POST', northForty)).status).toBe(404);
		const url = `${base(otherFarmId)}/${otherFieldId}`;
		expect((await owner.fetch(url)).status).toBe(404);
		expect((await owner.json(url, 'PATCH', { acres: 1 })).status).toBe(404);
		expect((await owner.fetch(url, { method: 'DELETE' })).status).toBe(404);
		expect(await farmSnapshot(db, otherFarmId)).toEqual(before);
	});
});

describe('who may', () => {
	it('signed out: 401 for every method', async () => {
		const anonymous = new Client();
		const url = `${base()}/${otherFieldId}`;
		expect((await anonymous.fetch(base())).status).toBe(401);
		expect((await anonymous.json(base(), 'POST', northForty)).status).toBe(401);
		expect((await anonymous.fetch(url)).status).toBe(401);
		expect((await anonymous.json(url, 'PATCH', { acres: 1 })).status).toBe(401);
		expect((await anonymous.fetch(url, { method: 'DELETE' })).status).toBe(401);
	});

	it('a reviewer reads the fields but gets 403 for adding, changing and deleting', async () => {
		const field = await addField({ name: 'Reviewed', acres: 30 });
		const reviewer = await reviewerOf(db, farmId, 'fields-reviewer');
		const before = await farmSnapshot(db, farmId);
		expect((await reviewer.fetch(base())).status).toBe(200);
		expect((await reviewer.fetch(`${base()}/${field.id}`)).status).toBe(200);
		const post = await reviewer.json(base(), 'POST', northForty);
		expect(post.status).toBe(403);
		expect((await post.json()).message).toBe('A reviewer of this farm may not do this.');
		expect((await reviewer.json(`${base()}/${field.id}`, 'PATCH', { acres: 1 })).status).toBe(403);
		expect((await reviewer.fetch(`${base()}/${field.id}`, { method: 'DELETE' })).status).toBe(403);
		expect(await farmSnapshot(db, farmId)).toEqual(before);
	});

	it('the demo lender, a reviewer of the demo farm, cannot change its fields', async () => {
		const lender = await signedIn(demoUsers.lender);
		const { farms } = await (await lender.fetch('/api/v1/farms')).json();
		const demoId = farms.find((f: { name: string }) => f.name === 'Maple Coulee Farm').id;
		const { fields: demoFields } = await (await lender.fetch(base(demoId))).json();
		expect(demoFields.length).toBeGreaterThan(0);
		const before = await farmSnapshot(db, demoId);
		const url = `${base(demoId)}/${demoFields[0].id}`;
		expect((await lender.json(base(demoId), 'POST', northForty)).status).toBe(403);
		expect((await lender.json(url, 'PATCH', { acres: 1 })).status).toBe(403);
		expect((await lender.fetch(url, { method: 'DELETE' })).status).toBe(403);
		expect(await farmSnapshot(db, demoId)).toEqual(before);
	});
});

describe('a field a plan uses', () => {
	it('is not deleted: 409 naming the plan, and the field, the plan and its assignment stay', async () => {
		const { owner: planner, farmId: planFarm } = await ownFarm('fields-plan');
		const doc = await importReferencePlan(db, planFarm);
		const [northFlat] = await db
			.select({ id: fields.id })
			.from(fields)
			.where(and(eq(fields.farmId, planFarm), eq(fields.key, 'north-flat')));
		const assignments = () =>
			db.select().from(planFieldAssignments).where(eq(planFieldAssignments.fieldId, northFlat.id));
		const before = await farmSnapshot(db, planFarm);
		expect(await assignments()).toHaveLength(1);
		const response = await planner.fetch(`${base(planFarm)}/${northFlat.id}`, {
			method: 'DELETE'
		});
		expect(response.status).toBe(409);
		const body = await response.json();
		expect(body.plans).toEqual([doc.plan.name]);
		expect(body.message).toContain(`"${doc.plan.name}"`);
		expect(body.message).toMatch(/^North Flat is in the plan /);
		expect(await farmSnapshot(db, planFarm)).toEqual(before);
		expect(await assignments()).toHaveLength(1);
	});
});
