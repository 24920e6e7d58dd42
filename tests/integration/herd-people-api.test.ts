// /api/v1/farms/[farmId]/herd and /people: the plan file's herd and person schemas, the farm guards,
// the farm's labour hours kept as the family's summed, and refusals that leave the database as it was.
import { readFileSync } from 'node:fs';
import { and, eq } from 'drizzle-orm';
import { beforeAll, describe, expect, it } from 'vitest';
import { parsePlanDocument } from '../../src/lib/schemas/plan-file';
import { exportPlanDocument, importPlanDocument } from '../../src/lib/server/db/plan-documents';
import { auditLog, farms, plans } from '../../src/lib/server/db/schema';
import { testDb } from '../support/db';
import { Client, signedIn } from '../support/http';
import { demoUsers } from '../support/server';
import { farmSettings, farmSnapshot, ownFarm, reviewerOf } from './farm-setup-support';

const db = testDb();

// An invented herd: 60 cows of 1,350 lb fed from November for 180 days.
const herd = {
	head: 60,
	averageWeightLb: 1350,
	feedingSeasonStartMonth: 11,
	feedingSeasonDays: 180,
	baleWeightLb: 1300,
	feedingWastePercent: 12,
	choreHoursPerDayFeedingHay: 1.5,
	choreHoursPerDayGrazing: 0.75
};
const months = (hours: number) => Array.from({ length: 12 }, () => hours);
const operator = { name: 'Ada Brandt', role: 'operator', hoursAvailableByMonth: months(150) };
const partner = {
	name: 'Jon Brandt',
	role: 'partner',
	hoursAvailableByMonth: [40, 40, 40, 60, 80, 60, 60, 60, 80, 90, 40, 40]
};
const hired = {
	name: 'Cal Ortiz',
	role: 'hired',
	hoursAvailableByMonth: months(20),
	wageUsdPerHour: 17.5
};

let owner: Client;
let farmId: string;
let otherOwner: Client;
let otherFarmId: string;
let otherPersonId: string;

const herdUrl = (farm = farmId) => `/api/v1/farms/${farm}/herd`;
const peopleUrl = (farm = farmId) => `/api/v1/farms/${farm}/people`;
type PersonAnswer = Record<string, unknown> & { id: string; key: string };

async function addPerson(body: Record<string, unknown>, client = owner, farm = farmId) {
	const response = await client.json(peopleUrl(farm), 'POST', body);
	expect(response.status).toBe(201);
	return (await response.json()).person as PersonAnswer;
}

const farmLabour = (farm: string) =>
	db
		.select({ hours: farms.labourHoursAvailableByMonth })
		.from(farms)
		.where(eq(farms.id, farm))
		.then((rows) => rows[0].hours);

const pathsOf = async (response: Response) =>
	((await response.json()).issues as { path: string }[]).map((issue) => issue.path);

beforeAll(async () => {
	[{ owner, farmId }, { owner: otherOwner, farmId: otherFarmId }] = await Promise.all([
		ownFarm('herd-people'),
		ownFarm('herd-people-other')
	]);
	otherPersonId = (await addPerson(operator, otherOwner, otherFarmId)).id;
	expect((await otherOwner.json(herdUrl(otherFarmId), 'PUT', herd)).status).toBe(200);
});

describe('the herd', () => {
	it('is null until an owner puts one; PUT fills the defaults, replaces, and records who did it', async () => {
		const { farmId: farm, owner: rancher } = await ownFarm('herd-put');
		expect(await (await rancher.fetch(herdUrl(farm))).json()).toEqual({ herd: null });

		const created = await rancher.json(herdUrl(farm), 'PUT', herd);
		expect(created.status).toBe(200);
		// The plan file's defaults: SRM glossary 26 lb DM per AU-day; hay at 88 % DM (UNL, UF/IFAS);
		// ASABE D384.2 beef cow 0.42 lb N a day (from memory).
		const full = {
			...herd,
			intakeLbDmPerAuDay: 26,
			maxGrazingDays: null,
			baleDryMatterPercent: 88,
			manureNitrogenLbPerAuDay: 0.42,
			manureNitrogenAvailablePercent: 0
		};
		expect(await created.json()).toEqual({ herd: full });
		expect(await (await rancher.fetch(herdUrl(farm))).json()).toEqual({ herd: full });

		const replaced = await rancher.json(herdUrl(farm), 'PUT', {
			...herd,
			head: 45,
			maxGrazingDays: 75
		});
		expect((await replaced.json()).herd).toEqual({ ...full, head: 45, maxGrazingDays: 75 });
		const audit = await db
			.select({ action: auditLog.action, detail: auditLog.detail })
			.from(auditLog)
			.where(and(eq(auditLog.farmId, farm), eq(auditLog.action, 'herd.updated')))
			.orderBy(auditLog.id);
		expect(audit).toEqual([
			{ action: 'herd.updated', detail: { head: 60 } },
			{ action: 'herd.updated', detail: { head: 45 } }
		]);
	});

	it('DELETE says the farm keeps no cattle: 204, then GET is null and a second DELETE 404', async () => {
		const { farmId: farm, owner: rancher } = await ownFarm('herd-delete');
		await rancher.json(herdUrl(farm), 'PUT', herd);
		expect((await rancher.fetch(herdUrl(farm), { method: 'DELETE' })).status).toBe(204);
		expect(await (await rancher.fetch(herdUrl(farm))).json()).toEqual({ herd: null });
		const before = await farmSnapshot(db, farm);
		expect((await rancher.fetch(herdUrl(farm), { method: 'DELETE' })).status).toBe(404);
		expect(await farmSnapshot(db, farm)).toEqual(before);
	});

	it('bad bodies: 422 naming each path, and nothing saved', async () => {
		await owner.json(herdUrl(), 'PUT', herd);
		for (const [body, issues] of [
			[
				{ ...herd, head: 'sixty', averageWeightLb: true },
				[
					{ path: 'head', message: 'Enter the number of head as a number.' },
					{ path: 'averageWeightLb', message: 'Enter the average live weight as a number.' }
				]
			],
			[
				{ ...herd, head: -3 },
				[{ path: 'head', message: 'The number of head must be at least 0.' }]
			],
			[
				{ ...herd, feedingSeasonStartMonth: 13, feedingWastePercent: 80 },
				[
					{
						path: 'feedingSeasonStartMonth',
						message:
							'The month the feeding season starts must be a month from 1 (January) to 12 (December).'
					},
					{ path: 'feedingWastePercent', message: 'Feeding waste must be at most 60 %.' }
				]
			],
			[{ ...herd, colour: 'red' }, [{ path: '(document)', message: expect.any(String) }]],
			[[herd], [{ path: '(document)', message: expect.any(String) }]]
		] as const) {
			const before = await farmSnapshot(db, farmId);
			const response = await owner.json(herdUrl(), 'PUT', body);
			expect(response.status, JSON.stringify(body)).toBe(422);
			expect((await response.json()).issues).toEqual(issues);
			expect(await farmSnapshot(db, farmId)).toEqual(before);
		}
		const before = await farmSnapshot(db, farmId);
		expect((await owner.json(herdUrl(), 'PUT', '{"head": ')).status).toBe(400);
		expect(await farmSnapshot(db, farmId)).toEqual(before);
	});
});

describe('people', () => {
	it('an owner adds, changes and deletes people; each write sums the family’s hours into the farm’s', async () => {
		const { farmId: farm, owner: farmer } = await ownFarm('people-labour');
		const typed = farmSettings('x').labourHoursAvailableByMonth;
		expect(await farmLabour(farm)).toEqual(typed);

		const ada = await addPerson(operator, farmer, farm);
		expect(ada).toEqual({
			id: expect.stringMatching(/^[0-9a-f-]{36}$/),
			key: 'ada-brandt',
			...operator,
			wageUsdPerHour: null,
			notes: ''
		});
		expect(await farmLabour(farm)).toEqual(months(150));
		const jon = await addPerson(partner, farmer, farm);
		expect(await farmLabour(farm)).toEqual(partner.hoursAvailableByMonth.map((h) => h + 150));
		// Hired hours are bought, not the farm's own.
		const cal = await addPerson(hired, farmer, farm);
		expect(cal).toMatchObject({ key: 'cal-ortiz', wageUsdPerHour: 17.5 });
		expect(await farmLabour(farm)).toEqual(partner.hoursAvailableByMonth.map((h) => h + 150));

		const listed = await (await farmer.fetch(peopleUrl(farm))).json();
		expect(listed.people.map((p: PersonAnswer) => p.key)).toEqual([
			'ada-brandt',
			'jon-brandt',
			'cal-ortiz'
		]);
		expect(listed.people).not.toContainEqual(expect.objectContaining({ id: otherPersonId }));

		const patched = await farmer.json(`${peopleUrl(farm)}/${ada.id}`, 'PATCH', {
			hoursAvailableByMonth: months(100)
		});
		expect(patched.status).toBe(200);
		expect((await patched.json()).person).toEqual({ ...ada, hoursAvailableByMonth: months(100) });
		expect(await farmLabour(farm)).toEqual(partner.hoursAvailableByMonth.map((h) => h + 100));
		expect(await (await farmer.fetch(`${peopleUrl(farm)}/${ada.id}`)).json()).toEqual({
			person: { ...ada, hoursAvailableByMonth: months(100) }
		});

		expect((await farmer.fetch(`${peopleUrl(farm)}/${jon.id}`, { method: 'DELETE' })).status).toBe(
			204
		);
		expect(await farmLabour(farm)).toEqual(months(100));
		expect((await farmer.fetch(`${peopleUrl(farm)}/${jon.id}`)).status).toBe(404);

		const actions = await db
			.select({ action: auditLog.action, detail: auditLog.detail })
			.from(auditLog)
			.where(eq(auditLog.farmId, farm))
			.orderBy(auditLog.id);
		expect(actions.filter((a) => a.action.startsWith('person.'))).toEqual([
			{ action: 'person.created', detail: { personId: ada.id, name: 'Ada Brandt' } },
			{ action: 'person.created', detail: { personId: jon.id, name: 'Jon Brandt' } },
			{ action: 'person.created', detail: { personId: cal.id, name: 'Cal Ortiz' } },
			{ action: 'person.updated', detail: { personId: ada.id, name: 'Ada Brandt' } },
			{ action: 'person.deleted', detail: { personId: jon.id, name: 'Jon Brandt' } }
		]);

		// The farm's settings keep the summed hours whatever hours they are given.
		const put = await farmer.json(`/api/v1/farms/${farm}`, 'PUT', {
			...farmSettings('Renamed'),
			labourHoursAvailableByMonth: months(999 / 3)
		});
		expect(put.status).toBe(200);
		expect((await put.json()).farm.labourHoursAvailableByMonth).toEqual(months(100));
		expect(await farmLabour(farm)).toEqual(months(100));
	});

	it('bad bodies: 422 with the path, the wage rule worded as the plan file words it, nothing saved', async () => {
		const ada = await addPerson(operator);
		const refusals: [string, string, unknown, string[], string?][] = [
			['POST', peopleUrl(), { ...operator, name: 7, role: 'boss' }, ['name', 'role']],
			[
				'POST',
				peopleUrl(),
				{ ...operator, hoursAvailableByMonth: months(10).concat(10) },
				['hoursAvailableByMonth'],
				'Give at most 12 hours for each month.'
			],
			[
				'POST',
				peopleUrl(),
				{ ...operator, hoursAvailableByMonth: [...months(10).slice(1), -5] },
				['hoursAvailableByMonth.11'],
				'Hours in a month must be at least 0 hours.'
			],
			[
				'POST',
				peopleUrl(),
				{ ...hired, wageUsdPerHour: undefined },
				['wageUsdPerHour'],
				"Give Cal Ortiz's wage: hired help is paid by the hour."
			],
			[
				'POST',
				peopleUrl(),
				{ ...operator, wageUsdPerHour: 20 },
				['wageUsdPerHour'],
				'Only hired help has a wage; leave it empty.'
			],
			[
				'POST',
				peopleUrl(),
				{ ...operator, key: ada.key },
				['key'],
				`Another person on this farm has the key "${ada.key}": choose another.`
			],
			[
				'POST',
				peopleUrl(),
				{ ...partner, hoursAvailableByMonth: [700, ...months(0).slice(1)] },
				['hoursAvailableByMonth.0'],
				"The family's hours in January would be 850: a farm's labour is at most 744 hours a month."
			],
			[
				'PATCH',
				`${peopleUrl()}/${ada.id}`,
				{ hoursAvailableByMonth: [...months(150).slice(1), 744.5] },
				['hoursAvailableByMonth.11'],
				'Hours in a month must be at most 744 hours.'
			],
			[
				'PATCH',
				`${peopleUrl()}/${ada.id}`,
				{ role: 'hired' },
				['wageUsdPerHour'],
				"Give Ada Brandt's wage: hired help is paid by the hour."
			],
			[
				'PATCH',
				`${peopleUrl()}/${ada.id}`,
				{ hoursAvailableByMonth: 'lots' },
				['hoursAvailableByMonth']
			],
			['PATCH', `${peopleUrl()}/${ada.id}`, { id: crypto.randomUUID() }, ['(document)']]
		];
		for (const [method, url, body, paths, message] of refusals) {
			const before = await farmSnapshot(db, farmId);
			const response = await owner.json(url, method, body);
			expect(response.status, JSON.stringify(body)).toBe(422);
			const { issues } = await response.clone().json();
			expect([...new Set(await pathsOf(response))].sort(), JSON.stringify(body)).toEqual(paths);
			if (message) expect(issues[0].message).toBe(message);
			expect(await farmSnapshot(db, farmId)).toEqual(before);
		}
	});
});

describe('ids and farms that are not yours', () => {
	it('another farm’s person through this farm’s URL, unknown and malformed ids: 404, nothing changed', async () => {
		const before = await farmSnapshot(db, otherFarmId);
		for (const id of [otherPersonId, crypto.randomUUID(), 'not-a-uuid']) {
			const url = `${peopleUrl()}/${id}`;
			expect((await owner.fetch(url)).status).toBe(404);
			expect((await owner.json(url, 'PATCH', { name: 'Taken' })).status).toBe(404);
			expect((await owner.fetch(url, { method: 'DELETE' })).status).toBe(404);
		}
		expect(await farmSnapshot(db, otherFarmId)).toEqual(before);
	});

	it('a farm the user is not a member of: 404 for every route and method', async () => {
		const before = await farmSnapshot(db, otherFarmId);
		const person = `${peopleUrl(otherFarmId)}/${otherPersonId}`;
		expect((await owner.fetch(herdUrl(otherFarmId))).status).toBe(404);
		expect((await owner.json(herdUrl(otherFarmId), 'PUT', herd)).status).toBe(404);
		expect((await owner.fetch(herdUrl(otherFarmId), { method: 'DELETE' })).status).toBe(404);
		expect((await owner.fetch(peopleUrl(otherFarmId))).status).toBe(404);
		expect((await owner.json(peopleUrl(otherFarmId), 'POST', operator)).status).toBe(404);
		expect((await owner.fetch(person)).status).toBe(404);
		expect((await owner.json(person, 'PATCH', { name: 'X' })).status).toBe(404);
		expect((await owner.fetch(person, { method: 'DELETE' })).status).toBe(404);
		expect(await farmSnapshot(db, otherFarmId)).toEqual(before);
	});
});

describe('who may', () => {
	it('signed out: 401 for every route and method', async () => {
		const anonymous = new Client();
		const person = `${peopleUrl()}/${otherPersonId}`;
		expect((await anonymous.fetch(herdUrl())).status).toBe(401);
		expect((await anonymous.json(herdUrl(), 'PUT', herd)).status).toBe(401);
		expect((await anonymous.fetch(herdUrl(), { method: 'DELETE' })).status).toBe(401);
		expect((await anonymous.fetch(peopleUrl())).status).toBe(401);
		expect((await anonymous.json(peopleUrl(), 'POST', operator)).status).toBe(401);
		expect((await anonymous.fetch(person)).status).toBe(401);
		expect((await anonymous.json(person, 'PATCH', { name: 'X' })).status).toBe(401);
		expect((await anonymous.fetch(person, { method: 'DELETE' })).status).toBe(401);
	});

	it('a reviewer reads the herd and people but gets 403 for every write', async () => {
		await owner.json(herdUrl(), 'PUT', herd);
		const person = await addPerson({ ...operator, name: 'Reviewed Person' });
		const reviewer = await reviewerOf(db, farmId, 'herd-people-reviewer');
		const before = await farmSnapshot(db, farmId);
		expect((await (await reviewer.fetch(herdUrl())).json()).herd).toMatchObject(herd);
		expect((await reviewer.fetch(peopleUrl())).status).toBe(200);
		expect((await reviewer.fetch(`${peopleUrl()}/${person.id}`)).status).toBe(200);
		const put = await reviewer.json(herdUrl(), 'PUT', herd);
		expect(put.status).toBe(403);
		expect((await put.json()).message).toBe('A reviewer of this farm may not do this.');
		expect((await reviewer.fetch(herdUrl(), { method: 'DELETE' })).status).toBe(403);
		expect((await reviewer.json(peopleUrl(), 'POST', operator)).status).toBe(403);
		const url = `${peopleUrl()}/${person.id}`;
		expect((await reviewer.json(url, 'PATCH', { name: 'Changed' })).status).toBe(403);
		expect((await reviewer.fetch(url, { method: 'DELETE' })).status).toBe(403);
		expect(await farmSnapshot(db, farmId)).toEqual(before);
	});

	it('the demo lender reads the demo farm’s people, whose family hours are its labour hours', async () => {
		const lender = await signedIn(demoUsers.lender);
		const { farms: list } = await (await lender.fetch('/api/v1/farms')).json();
		const demoId = list.find((f: { name: string }) => f.name === 'Maple Coulee Farm').id;
		const before = await farmSnapshot(db, demoId);
		const { people } = await (await lender.fetch(peopleUrl(demoId))).json();
		expect(people.map((p: { role: string }) => p.role)).toEqual([
			'operator',
			'partner',
			'family',
			'hired'
		]);
		const family = people.filter((p: { role: string }) => p.role !== 'hired');
		const summed = months(0).map((_, m) =>
			family.reduce(
				(sum: number, p: { hoursAvailableByMonth: number[] }) => sum + p.hoursAvailableByMonth[m],
				0
			)
		);
		expect(summed).toEqual(await farmLabour(demoId));
		expect((await lender.json(peopleUrl(demoId), 'POST', operator)).status).toBe(403);
		expect((await lender.json(herdUrl(demoId), 'PUT', herd)).status).toBe(403);
		expect(await farmSnapshot(db, demoId)).toEqual(before);
	});
});

describe('plan files', () => {
	it('carry the farm’s people in and out; the import sums the family’s hours into the farm’s', async () => {
		const { farmId: farm } = await ownFarm('people-plan-file');
		const file = JSON.parse(readFileSync('scenarios/reference.json', 'utf8'));
		const workers = [
			{ id: 'ada', ...operator, hoursAvailableByMonth: file.farm.labourHoursAvailableByMonth },
			{ id: 'cal', ...hired, notes: 'Harvest only.' }
		];
		const parsed = parsePlanDocument({ ...file, people: workers });
		if (!parsed.ok) throw new Error(JSON.stringify(parsed.issues));
		await db.transaction((tx) =>
			importPlanDocument(tx, { farmId: farm, userId: null, doc: parsed.plan, isReference: true })
		);
		expect(await farmLabour(farm)).toEqual(file.farm.labourHoursAvailableByMonth);
		const [plan] = await db.select({ id: plans.id }).from(plans).where(eq(plans.farmId, farm));
		const exported = parsePlanDocument(await exportPlanDocument(db, plan.id));
		expect(exported.ok && exported.plan.people).toEqual([
			{ ...workers[0], wageUsdPerHour: null, notes: '' },
			workers[1]
		]);
	});
});
