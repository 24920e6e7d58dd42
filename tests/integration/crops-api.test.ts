// /api/v1/farms/[farmId]/crops: built-in crops always listed and read-only, the farm's own crops added,
// changed and deleted on the plan file's crop schema; refusals leave the database as it was.
import { and, eq } from 'drizzle-orm';
import { beforeAll, describe, expect, it } from 'vitest';
import { builtInCrops } from '../../src/lib/schemas/crops';
import { cropPractices, crops } from '../../src/lib/server/db/schema';
import { testDb } from '../support/db';
import { Client, signedIn } from '../support/http';
import { demoUsers } from '../support/server';
import { farmSnapshot, importReferencePlan, ownFarm, reviewerOf } from './farm-setup-support';

const db = testDb();
const sorghum = {
	name: 'Grain sorghum',
	soldBy: 'cwt',
	residueLeafHuskLbDmPerUnit: null,
	legume: false
};

let owner: Client;
let farmId: string;
let otherOwner: Client;
let otherFarmId: string;

const base = (farm = farmId) => `/api/v1/farms/${farm}/crops`;

async function addCrop(body: Record<string, unknown>, client = owner, farm = farmId) {
	const response = await client.json(base(farm), 'POST', body);
	expect(response.status, JSON.stringify(await response.clone().json())).toBe(201);
	return (await response.json()).crop as Record<string, unknown> & { id: string };
}

beforeAll(async () => {
	[{ owner, farmId }, { owner: otherOwner, farmId: otherFarmId }] = await Promise.all([
		ownFarm('crops'),
		ownFarm('crops-other')
	]);
	await addCrop(
		{ ...sorghum, name: 'Other farm crop', id: 'other-farm-crop' },
		otherOwner,
		otherFarmId
	);
});

describe('the list', () => {
	it('has the built-in crops on a new farm that has no crop rows, marked built in', async () => {
		const response = await owner.fetch(base());
		expect(response.status).toBe(200);
		const listed = (await response.json()).crops;
		expect(listed.slice(0, builtInCrops.length)).toEqual(
			builtInCrops.map((crop) => ({ ...crop, builtIn: true }))
		);
		expect(listed.map((c: { id: string }) => c.id)).not.toContain('other-farm-crop');
	});

	it('adds the farm’s own crops after the built-ins', async () => {
		const crop = await addCrop({ ...sorghum, name: 'Triticale', soldBy: 'bu', lbPerUnit: 48 });
		expect(crop).toEqual({
			id: 'triticale',
			name: 'Triticale',
			soldBy: 'bu',
			lbPerUnit: 48,
			residueLeafHuskLbDmPerUnit: null,
			legume: false,
			builtIn: false
		});
		const listed = (await (await owner.fetch(base())).json()).crops;
		expect(listed.slice(builtInCrops.length)).toContainEqual(crop);
	});
});

describe('an owner', () => {
	it('adds a crop sold by the hundredweight: its weight comes from the unit', async () => {
		const crop = await addCrop(sorghum);
		expect(crop).toMatchObject({ id: 'grain-sorghum', lbPerUnit: 100 });
		const [row] = await db
			.select()
			.from(crops)
			.where(and(eq(crops.farmId, farmId), eq(crops.key, 'grain-sorghum')));
		expect(row).toMatchObject({ name: 'Grain sorghum', soldBy: 'cwt', lbPerUnit: 100 });
		expect((await (await owner.fetch(`${base()}/grain-sorghum`)).json()).crop).toEqual(crop);
	});

	it('reads a built-in crop by its id', async () => {
		const response = await owner.fetch(`${base()}/corn`);
		expect(response.status).toBe(200);
		expect((await response.json()).crop).toEqual({ ...builtInCrops[0], builtIn: true });
	});

	it('changes only what the body gives; a new sale unit brings its own weight', async () => {
		await addCrop({
			...sorghum,
			name: 'Field peas',
			id: 'field-peas',
			soldBy: 'bu',
			lbPerUnit: 60,
			legume: true
		});
		const legume = await owner.json(`${base()}/field-peas`, 'PATCH', { name: 'Dry peas' });
		expect(legume.status).toBe(200);
		expect((await legume.json()).crop).toMatchObject({
			id: 'field-peas',
			name: 'Dry peas',
			lbPerUnit: 60,
			legume: true
		});
		const byTon = await owner.json(`${base()}/field-peas`, 'PATCH', { soldBy: 'ton' });
		expect((await byTon.json()).crop).toMatchObject({ soldBy: 'ton', lbPerUnit: 2000 });
	});

	it('deletes a crop of its own that no practice grows', async () => {
		await addCrop({ ...sorghum, name: 'Millet', soldBy: 'bu', lbPerUnit: 50 });
		const response = await owner.fetch(`${base()}/millet`, { method: 'DELETE' });
		expect(response.status).toBe(204);
		expect((await owner.fetch(`${base()}/millet`)).status).toBe(404);
	});
});

describe('refusals that change nothing', () => {
	const unchanged = async (request: () => Promise<Response>, farm = farmId) => {
		const before = await farmSnapshot(db, farm);
		const response = await request();
		expect(await farmSnapshot(db, farm)).toEqual(before);
		return response;
	};
	const pathsOf = async (response: Response) =>
		((await response.json()).issues as { path: string }[]).map((issue) => issue.path).sort();

	it('wrong types: 422 naming each path', async () => {
		const response = await unchanged(() =>
			owner.json(base(), 'POST', { name: 7, soldBy: 'bushel', legume: 'yes', lbPerUnit: '56' })
		);
		expect(response.status).toBe(422);
		expect(await pathsOf(response)).toEqual(['lbPerUnit', 'legume', 'name', 'soldBy']);
	});

	it('a bushel crop without its weight, or a ton that is not 2,000 lb: 422 on lbPerUnit', async () => {
		const noWeight = await unchanged(() =>
			owner.json(base(), 'POST', { ...sorghum, name: 'Flax', soldBy: 'bu' })
		);
		expect(noWeight.status).toBe(422);
		expect((await noWeight.json()).issues).toEqual([
			{
				path: 'lbPerUnit',
				message: 'Give the pounds in one bushel of Flax (e.g. corn 56, soybean 60).'
			}
		]);
		const wrongTon = await unchanged(() =>
			owner.json(base(), 'POST', { ...sorghum, soldBy: 'ton', lbPerUnit: 1000 })
		);
		expect(await pathsOf(wrongTon)).toEqual(['lbPerUnit']);
	});

	it('negative residue and an unknown key: 422', async () => {
		const response = await unchanged(() =>
			owner.json(base(), 'POST', { ...sorghum, residueLeafHuskLbDmPerUnit: -3, colour: 'red' })
		);
		expect(response.status).toBe(422);
		expect(await pathsOf(response)).toEqual(['(document)', 'residueLeafHuskLbDmPerUnit']);
	});

	it('an id a built-in or one of the farm’s crops has: 422 on id', async () => {
		const builtIn = await unchanged(() => owner.json(base(), 'POST', { ...sorghum, id: 'corn' }));
		expect(builtIn.status).toBe(422);
		expect((await builtIn.json()).issues).toEqual([
			{ path: 'id', message: '"corn" is a built-in crop: give your crop another id.' }
		]);
		await addCrop({ ...sorghum, name: 'Own once', id: 'own-once' });
		const own = await unchanged(() => owner.json(base(), 'POST', { ...sorghum, id: 'own-once' }));
		expect(await pathsOf(own)).toEqual(['id']);
	});

	it('a built-in crop cannot be changed or deleted: 409', async () => {
		const patch = await unchanged(() => owner.json(`${base()}/corn`, 'PATCH', { lbPerUnit: 50 }));
		expect(patch.status).toBe(409);
		expect((await patch.json()).message).toMatch(/^Corn is a built-in crop/);
		const del = await unchanged(() => owner.fetch(`${base()}/corn`, { method: 'DELETE' }));
		expect(del.status).toBe(409);
	});

	it('PATCH with bad values or a new id: 422', async () => {
		await addCrop({ ...sorghum, name: 'Patchable', id: 'patchable' });
		for (const [body, path] of [
			[{ lbPerUnit: -1 }, 'lbPerUnit'],
			[{ soldBy: 'bu' }, 'lbPerUnit'],
			[{ id: 'renamed' }, 'id'],
			[{ name: '' }, 'name'],
			[[1, 2], '(document)']
		] as const) {
			const response = await unchanged(() => owner.json(`${base()}/patchable`, 'PATCH', body));
			expect(response.status, JSON.stringify(body)).toBe(422);
			expect(await pathsOf(response)).toContain(path);
		}
	});

	it('another farm’s crop or an unknown id: 404, and the other farm keeps its crop', async () => {
		for (const id of ['other-farm-crop', 'no-such-crop']) {
			await unchanged(async () => {
				expect((await owner.fetch(`${base()}/${id}`)).status).toBe(404);
				expect((await owner.json(`${base()}/${id}`, 'PATCH', { name: 'x' })).status).toBe(404);
				return owner.fetch(`${base()}/${id}`, { method: 'DELETE' });
			}, otherFarmId).then((response) => expect(response.status).toBe(404));
		}
		await unchanged(async () => {
			expect((await owner.json(base(otherFarmId), 'POST', sorghum)).status).toBe(404);
			return owner.fetch(`${base(otherFarmId)}/other-farm-crop`, { method: 'DELETE' });
		}, otherFarmId).then((response) => expect(response.status).toBe(404));
	});

	it('signed out: 401; a reviewer: 403 for every change', async () => {
		const anonymous = new Client();
		expect((await anonymous.fetch(base())).status).toBe(401);
		expect((await anonymous.json(base(), 'POST', sorghum)).status).toBe(401);
		expect((await anonymous.fetch(`${base()}/corn`)).status).toBe(401);
		expect((await anonymous.json(`${base()}/corn`, 'PATCH', {})).status).toBe(401);
		expect((await anonymous.fetch(`${base()}/corn`, { method: 'DELETE' })).status).toBe(401);

		await addCrop({ ...sorghum, name: 'Reviewed crop', id: 'reviewed-crop' });
		const reviewer = await reviewerOf(db, farmId, 'crops-reviewer');
		expect((await reviewer.fetch(base())).status).toBe(200);
		await unchanged(async () => {
			expect((await reviewer.json(base(), 'POST', sorghum)).status).toBe(403);
			expect((await reviewer.json(`${base()}/reviewed-crop`, 'PATCH', { name: 'x' })).status).toBe(
				403
			);
			return reviewer.fetch(`${base()}/reviewed-crop`, { method: 'DELETE' });
		}).then((response) => expect(response.status).toBe(403));

		const lender = await signedIn(demoUsers.lender);
		const { farms } = await (await lender.fetch('/api/v1/farms')).json();
		const demoId = farms.find((f: { name: string }) => f.name === 'Maple Coulee Farm').id;
		await unchanged(() => lender.json(base(demoId), 'POST', sorghum), demoId).then((response) =>
			expect(response.status).toBe(403)
		);
	});
});

describe('a crop a practice grows', () => {
	it('is not deleted: 409 naming the practices, and the crop stays', async () => {
		const { owner: planner, farmId: planFarm } = await ownFarm('crops-practice');
		await importReferencePlan(db, planFarm);
		await addCrop({ ...sorghum, id: 'sorghum' }, planner, planFarm);
		// A practice of the imported plan, copied to grow the farm's own crop.
		const [practice] = await db
			.select()
			.from(cropPractices)
			.where(eq(cropPractices.farmId, planFarm))
			.limit(1);
		const { id: _, createdAt: __, updatedAt: ___, ...copy } = practice;
		await db.insert(cropPractices).values([
			{ ...copy, key: 'sorghum-b', name: 'Sorghum, banded N', crop: 'sorghum' },
			{ ...copy, key: 'sorghum-a', name: 'Sorghum, all N up front', crop: 'sorghum' }
		]);
		const before = await farmSnapshot(db, planFarm);
		const response = await planner.fetch(`${base(planFarm)}/sorghum`, { method: 'DELETE' });
		expect(response.status).toBe(409);
		const body = await response.json();
		expect(body.practices).toEqual(['Sorghum, all N up front', 'Sorghum, banded N']);
		expect(body.message).toBe(
			'Grain sorghum is grown in the practices "Sorghum, all N up front", "Sorghum, banded N": change those practices before deleting it.'
		);
		expect(await farmSnapshot(db, planFarm)).toEqual(before);
	});
});
