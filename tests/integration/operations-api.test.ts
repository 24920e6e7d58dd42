// /api/v1/farms/[farmId]/operations and /api/v1/operation-defaults: the plan file's operation schema,
// the farm guards, and refusals that leave the database exactly as it was.
import { and, eq } from 'drizzle-orm';
import { beforeAll, describe, expect, it } from 'vitest';
import { operationDefaultsById } from '../../src/lib/operation-defaults';
import { auditLog, fieldOperations, practiceOperations } from '../../src/lib/server/db/schema';
import { testDb } from '../support/db';
import { Client } from '../support/http';
import { farmSnapshot, importReferencePlan, ownFarm, reviewerOf } from './farm-setup-support';

const db = testDb();

// ISU A3-24 Table 1: NH3 applicator, 15 knives (37.5 ft at 30 in), 6 mph, 65 % → 17.7 ac/h;
// Univ. of Missouri G1208: anhydrous applicator 0.65 gal/ac.
const applicator = {
	name: 'Anhydrous bar, 15 knives',
	by: 'own',
	statedAs: 'machine',
	month: 4,
	speedMph: 6,
	widthFt: 37.5,
	fieldEfficiencyPercent: 65,
	fuel: { basis: 'per-acre', dieselGallonsPerAcre: 0.65 },
	labourFactor: 1.1,
	repairsUsdPerAcre: 2.5
};
// Univ. of Nebraska CropWatch: spray about 0.11 gal/ac a pass; hours per acre typed by the farm.
const perAcreSpray = {
	name: 'Spraying, per acre',
	by: 'own',
	statedAs: 'per-acre',
	month: 6,
	dieselGallonsPerAcre: 0.11,
	machineHoursPerAcre: 0.03,
	labourHoursPerAcre: 0.04
};

let owner: Client;
let farmId: string;
let otherOwner: Client;
let otherFarmId: string;
let otherOperationId: string;

const base = (farm = farmId) => `/api/v1/farms/${farm}/operations`;
type Saved = Record<string, unknown> & { id: string; key: string; name: string };

async function addOperation(
	body: Record<string, unknown> = applicator,
	client = owner,
	farm = farmId
) {
	const response = await client.json(base(farm), 'POST', body);
	expect(response.status, JSON.stringify(body)).toBe(201);
	return (await response.json()).operation as Saved;
}

const pathsOf = async (response: Response) =>
	((await response.json()).issues as { path: string }[]).map((issue) => issue.path);

beforeAll(async () => {
	[{ owner, farmId }, { owner: otherOwner, farmId: otherFarmId }] = await Promise.all([
		ownFarm('operations'),
		ownFarm('operations-other')
	]);
	otherOperationId = (
		await addOperation({ name: 'Other farm pass', by: 'custom', month: 9 }, otherOwner, otherFarmId)
	).id;
});

describe('an owner', () => {
	it('adds an operation and gets it back with its row id, a key made from the name, and an audit entry', async () => {
		const saved = await addOperation();
		expect(saved).toEqual({
			...applicator,
			id: expect.stringMatching(/^[0-9a-f-]{36}$/),
			key: 'anhydrous-bar-15-knives',
			copiedFrom: null
		});
		const read = await owner.fetch(`${base()}/${saved.id}`);
		expect(read.status).toBe(200);
		expect((await read.json()).operation).toEqual(saved);
		const audit = await db
			.select()
			.from(auditLog)
			.where(and(eq(auditLog.farmId, farmId), eq(auditLog.action, 'operation.created')));
		expect(audit.map((entry) => entry.detail)).toContainEqual({
			operationId: saved.id,
			name: applicator.name
		});
	});

	it('states an operation per acre (repairs default 0) or as hired, and lists them by month', async () => {
		const spray = await addOperation(perAcreSpray);
		expect(spray).toMatchObject({ ...perAcreSpray, repairsUsdPerAcre: 0 });
		const hired = await addOperation({ name: 'Custom combining', by: 'custom', month: 10 });
		expect(hired).toEqual({
			id: hired.id,
			key: 'custom-combining',
			name: 'Custom combining',
			by: 'custom',
			month: 10,
			copiedFrom: null
		});
		const { operations } = await (await owner.fetch(base())).json();
		const months = operations.map((op: { month: number }) => op.month);
		expect(months).toEqual([...months].sort((a: number, b: number) => a - b));
		expect(operations.map((op: Saved) => op.id)).toEqual(
			expect.arrayContaining([spray.id, hired.id])
		);
		expect(operations.map((op: Saved) => op.name)).not.toContain('Other farm pass');
	});

	it('copies a catalogue default: its values, a key from its id, and copiedFrom naming it', async () => {
		const { source, id, ...chisel } = operationDefaultsById.get('chisel-plow')!;
		expect(source).toContain('PM 696');
		const first = await addOperation({ ...chisel, copiedFrom: id });
		const second = await addOperation({ ...chisel, copiedFrom: id });
		expect(first).toEqual({
			...chisel,
			id: first.id,
			key: 'chisel-plow',
			copiedFrom: 'chisel-plow'
		});
		expect(second.key).toBe('chisel-plow-2');
	});

	it('lists the catalogue with sources for any signed-in user', async () => {
		const response = await otherOwner.fetch('/api/v1/operation-defaults');
		expect(response.status).toBe(200);
		const { operationDefaults } = await response.json();
		expect(operationDefaults).toContainEqual(operationDefaultsById.get('nh3-applicator'));
		expect(operationDefaults.every((op: { source: string }) => op.source.length > 0)).toBe(true);
		expect((await new Client().fetch('/api/v1/operation-defaults')).status).toBe(401);
	});

	it('changes only what the body gives; a new kind keeps the name and month and clears the machine', async () => {
		const saved = await addOperation({ ...applicator, name: 'Patched bar' });
		const faster = await owner.json(`${base()}/${saved.id}`, 'PATCH', { speedMph: 7 });
		expect(faster.status).toBe(200);
		expect((await faster.json()).operation).toEqual({ ...saved, speedMph: 7 });
		const hired = await owner.json(`${base()}/${saved.id}`, 'PATCH', { by: 'custom' });
		expect(hired.status).toBe(200);
		expect((await hired.json()).operation).toEqual({
			id: saved.id,
			key: saved.key,
			name: 'Patched bar',
			by: 'custom',
			month: 4,
			copiedFrom: null
		});
		const [row] = await db.select().from(fieldOperations).where(eq(fieldOperations.id, saved.id));
		expect(row).toMatchObject({ statedAs: null, speedMph: null, widthFt: null, fuelBasis: null });
	});

	it('deletes an operation no practice uses', async () => {
		const saved = await addOperation({ name: 'Gone soon', by: 'custom', month: 3 });
		const response = await owner.fetch(`${base()}/${saved.id}`, { method: 'DELETE' });
		expect(response.status).toBe(204);
		expect(await db.select().from(fieldOperations).where(eq(fieldOperations.id, saved.id))).toEqual(
			[]
		);
		expect((await owner.fetch(`${base()}/${saved.id}`)).status).toBe(404);
	});
});

describe('bad bodies: 422 naming the path, nothing saved', () => {
	const refusedPost = async (body: unknown) => {
		const before = await farmSnapshot(db, farmId);
		const response = await owner.json(base(), 'POST', body);
		expect(await farmSnapshot(db, farmId)).toEqual(before);
		return response;
	};

	it('wrong types', async () => {
		const response = await refusedPost({ ...applicator, name: 5, speedMph: 'fast', month: 'May' });
		expect(response.status).toBe(422);
		expect((await response.json()).issues).toEqual(
			expect.arrayContaining([
				{ path: 'name', message: 'Enter the operation name as text.' },
				{ path: 'speedMph', message: 'Enter the speed as a number.' },
				{
					path: 'month',
					message: "The operation's month must be a month from 1 (January) to 12 (December)."
				}
			])
		);
	});

	it('a negative width and a field efficiency of 150 %', async () => {
		const response = await refusedPost({
			...applicator,
			widthFt: -30,
			fieldEfficiencyPercent: 150
		});
		expect(response.status).toBe(422);
		expect((await response.json()).issues).toEqual([
			{ path: 'widthFt', message: 'The working width must be at least 1 ft.' },
			{ path: 'fieldEfficiencyPercent', message: 'The field efficiency must be at most 100 %.' }
		]);
	});

	it('a per-acre body with machine values', async () => {
		const response = await refusedPost({ ...perAcreSpray, speedMph: 6, widthFt: 90 });
		expect(response.status).toBe(422);
		const { issues } = await response.json();
		expect(issues).toEqual([
			{ path: '(document)', message: expect.stringMatching(/Unknown keys "speedMph", "widthFt"/) }
		]);
	});

	it('an unknown copiedFrom, a missing kind, a taken key, a body that is not an object', async () => {
		const unknown = await refusedPost({ ...applicator, copiedFrom: 'steam-plow' });
		expect(unknown.status).toBe(422);
		expect((await unknown.json()).issues).toEqual([
			{
				path: 'copiedFrom',
				message:
					'"steam-plow" is not a catalogue default: GET /api/v1/operation-defaults lists them.'
			}
		]);
		const noKind = await refusedPost({ name: 'What is it', month: 5 });
		expect(noKind.status).toBe(422);
		expect(await pathsOf(noKind)).toEqual(['by']);
		await addOperation({ name: 'Keyed', by: 'custom', month: 5, key: 'keyed' });
		const taken = await refusedPost({ name: 'Keyed again', by: 'custom', month: 5, key: 'keyed' });
		expect(taken.status).toBe(422);
		expect((await taken.json()).issues).toEqual([
			{
				path: 'key',
				message: 'Another operation of this farm has the key "keyed": choose another.'
			}
		]);
		expect((await refusedPost([applicator])).status).toBe(422);
		expect((await refusedPost('{"name": ')).status).toBe(400);
	});

	it('PATCH with bad values, a half-stated new kind or a taken key changes nothing', async () => {
		const saved = await addOperation({ ...applicator, name: 'Patch me' });
		await addOperation({ name: 'Taken key', by: 'custom', month: 5, key: 'taken-key' });
		const before = await farmSnapshot(db, farmId);
		for (const [body, path] of [
			[{ widthFt: -1 }, 'widthFt'],
			[{ fieldEfficiencyPercent: 150 }, 'fieldEfficiencyPercent'],
			[{ fuel: { basis: 'pto-power' } }, 'fuel.tractorMaxPtoHp'],
			[{ statedAs: 'per-acre' }, 'dieselGallonsPerAcre'],
			[{ copiedFrom: 'steam-plow' }, 'copiedFrom'],
			[{ key: 'taken-key' }, 'key'],
			[{ id: crypto.randomUUID() }, '(document)'],
			['"just text"', '(document)']
		] as const) {
			const response = await owner.json(`${base()}/${saved.id}`, 'PATCH', body);
			expect(response.status, JSON.stringify(body)).toBe(422);
			expect(await pathsOf(response)).toContain(path);
		}
		expect(await farmSnapshot(db, farmId)).toEqual(before);
	});
});

describe('ids that are not the farm’s', () => {
	it('another farm’s operation through this farm’s URL, an unknown id, a malformed id: 404, nothing changed', async () => {
		const before = await farmSnapshot(db, otherFarmId);
		for (const id of [otherOperationId, crypto.randomUUID(), 'not-a-uuid']) {
			const url = `${base()}/${id}`;
			expect((await owner.fetch(url)).status).toBe(404);
			expect((await owner.json(url, 'PATCH', { month: 1 })).status).toBe(404);
			expect((await owner.fetch(url, { method: 'DELETE' })).status).toBe(404);
		}
		expect(await farmSnapshot(db, otherFarmId)).toEqual(before);
	});

	it('a farm the user is not a member of: 404 for every method', async () => {
		const before = await farmSnapshot(db, otherFarmId);
		const url = `${base(otherFarmId)}/${otherOperationId}`;
		expect((await owner.fetch(base(otherFarmId))).status).toBe(404);
		expect((await owner.json(base(otherFarmId), 'POST', applicator)).status).toBe(404);
		expect((await owner.fetch(url)).status).toBe(404);
		expect((await owner.json(url, 'PATCH', { month: 1 })).status).toBe(404);
		expect((await owner.fetch(url, { method: 'DELETE' })).status).toBe(404);
		expect(await farmSnapshot(db, otherFarmId)).toEqual(before);
	});
});

describe('who may', () => {
	it('signed out: 401 for every method', async () => {
		const anonymous = new Client();
		const url = `${base()}/${otherOperationId}`;
		expect((await anonymous.fetch(base())).status).toBe(401);
		expect((await anonymous.json(base(), 'POST', applicator)).status).toBe(401);
		expect((await anonymous.fetch(url)).status).toBe(401);
		expect((await anonymous.json(url, 'PATCH', { month: 1 })).status).toBe(401);
		expect((await anonymous.fetch(url, { method: 'DELETE' })).status).toBe(401);
	});

	it('a reviewer reads the operations and the catalogue but gets 403 for adding, changing and deleting', async () => {
		const saved = await addOperation({ ...applicator, name: 'Reviewed bar' });
		const reviewer = await reviewerOf(db, farmId, 'operations-reviewer');
		const before = await farmSnapshot(db, farmId);
		const url = `${base()}/${saved.id}`;
		expect((await reviewer.fetch(base())).status).toBe(200);
		expect((await reviewer.fetch(url)).status).toBe(200);
		expect((await reviewer.fetch('/api/v1/operation-defaults')).status).toBe(200);
		const post = await reviewer.json(base(), 'POST', {
			...applicator,
			copiedFrom: 'nh3-applicator'
		});
		expect(post.status).toBe(403);
		expect((await post.json()).message).toBe('A reviewer of this farm may not do this.');
		expect((await reviewer.json(url, 'PATCH', { month: 1 })).status).toBe(403);
		expect((await reviewer.fetch(url, { method: 'DELETE' })).status).toBe(403);
		expect(await farmSnapshot(db, farmId)).toEqual(before);
	});
});

describe('an operation a practice uses', () => {
	it('is not deleted: 409 naming the practices, and the operation and its steps stay', async () => {
		const { owner: planner, farmId: planFarm } = await ownFarm('operations-plan');
		const doc = await importReferencePlan(db, planFarm);
		const [planter] = await db
			.select({ id: fieldOperations.id })
			.from(fieldOperations)
			.where(and(eq(fieldOperations.farmId, planFarm), eq(fieldOperations.key, 'no-till-planter')));
		const steps = () =>
			db.select().from(practiceOperations).where(eq(practiceOperations.operationId, planter.id));
		const using = doc.practices
			.filter((p) => p.operations.some((step) => step.operationId === 'no-till-planter'))
			.map((p) => p.name)
			.sort();
		expect(using.length).toBeGreaterThan(1);
		const stepsBefore = await steps();
		const before = await farmSnapshot(db, planFarm);
		const response = await planner.fetch(`${base(planFarm)}/${planter.id}`, { method: 'DELETE' });
		expect(response.status).toBe(409);
		const body = await response.json();
		expect(body.practices).toEqual(using);
		expect(body.message).toMatch(/^No-till planter, 12 rows at 30 in is in the practices "/);
		expect(await farmSnapshot(db, planFarm)).toEqual(before);
		expect(await steps()).toEqual(stepsBefore);
	});
});
