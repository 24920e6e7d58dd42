// The herd and people pages: forms that work without JavaScript (plain POSTs) and with it (the action
// answers `use:enhance` reads), the live figures as the server renders them, and no edit controls for
// a reviewer.
import { and, eq } from 'drizzle-orm';
import { beforeAll, describe, expect, it } from 'vitest';
import { farms, herds, people } from '../../src/lib/server/db/schema';
import { testDb } from '../support/db';
import type { Client } from '../support/http';
import { farmSettings, farmSnapshot, ownFarm, reviewerOf } from './farm-setup-support';

const db = testDb();
const html = { headers: { Accept: 'text/html' } };
const mainOf = (page: string) => page.split('<main')[1].split('</main>')[0];

// The demo farm's herd (invented): 60 cows of 1,350 lb, fed from November for 180 days.
const herdForm = {
	head: '60',
	averageWeightLb: '1350',
	intakeLbDmPerAuDay: '26',
	feedingSeasonStartMonth: '11',
	feedingSeasonDays: '180',
	maxGrazingDays: '',
	baleWeightLb: '1300',
	baleDryMatterPercent: '88',
	feedingWastePercent: '12',
	choreHoursPerDayFeedingHay: '1.5',
	choreHoursPerDayGrazing: '0.75',
	manureNitrogenLbPerAuDay: '0.42',
	manureNitrogenAvailablePercent: '0'
};
const hours = (each: number) => Array.from({ length: 12 }, () => String(each));
const personForm = (name: string, role: string, each: number, wage = '') => ({
	name,
	role,
	hoursAvailableByMonth: hours(each),
	wageUsdPerHour: wage,
	notes: ''
});

let owner: Client;
let farmId: string;
let reviewer: Client;

const herdRow = (farm = farmId) =>
	db
		.select()
		.from(herds)
		.where(eq(herds.farmId, farm))
		.then((rows) => rows[0]);
const personRow = (name: string) =>
	db
		.select()
		.from(people)
		.where(and(eq(people.farmId, farmId), eq(people.name, name)))
		.then((rows) => rows[0]);
const farmLabour = () =>
	db
		.select({ hours: farms.labourHoursAvailableByMonth })
		.from(farms)
		.where(eq(farms.id, farmId))
		.then((rows) => rows[0].hours);

beforeAll(async () => {
	({ owner, farmId } = await ownFarm('herd-pages'));
	reviewer = await reviewerOf(db, farmId, 'herd-pages-reviewer');
});

describe('the herd page', () => {
	it('saves a herd without JavaScript and shows what it needs', async () => {
		const response = await owner.postForm(`/farms/${farmId}/herd?/save`, herdForm);
		expect(response.status).toBe(303);
		expect(response.headers.get('location')).toBe(`/farms/${farmId}/herd?saved=1`);
		expect(await herdRow()).toMatchObject({ head: 60, maxGrazingDays: null, baleWeightLb: 1300 });
		const page = await (await owner.fetch(`/farms/${farmId}/herd`, html)).text();
		// SRM glossary: 60 × 1,350 lb ÷ 1,000 lb = 81 AU; × 180 days = 14,580 AU-days; × 26 lb = 379,080 lb DM.
		// Bales with no grazing (REFERENCE-VALUES §5d, waste as a share of hay put out):
		// 379,080 ÷ (1,300 lb × 0.88) ÷ (1 − 0.12) = 376.6 → 377 bales.
		expect(page).toMatch(/data-value="animalUnits"[^>]*>\s*81\.0 AU/);
		expect(page).toMatch(/data-value="demandAuDays"[^>]*>\s*14,580 AU-days/);
		expect(page).toMatch(/data-value="demandLbDm"[^>]*>\s*379,080 lb DM/);
		expect(page).toMatch(/data-value="bales"[^>]*>\s*377 bales/);
		expect(page).toContain('Hay price: set in each year');
	});

	it('a bad value comes back beside its input, nothing saved; with JavaScript it is a 400 failure', async () => {
		const before = await farmSnapshot(db, farmId);
		const response = await owner.postForm(`/farms/${farmId}/herd?/save`, {
			...herdForm,
			head: '-4'
		});
		expect(response.status).toBe(400);
		expect(await response.text()).toMatch(
			/data-error-for="head"[^>]*>\s*The number of head must be at least 0.\s*</
		);
		const result = await owner.action(`/farms/${farmId}/herd?/save`, {
			...herdForm,
			feedingWastePercent: '75'
		});
		expect(result).toMatchObject({ type: 'failure', status: 400 });
		expect(result.data).toContain('Feeding waste must be at most 60 %.');
		expect(await farmSnapshot(db, farmId)).toEqual(before);
	});

	it('a reviewer sees the values and figures with no form, and may not post', async () => {
		const response = await reviewer.fetch(`/farms/${farmId}/herd`, html);
		expect(response.status).toBe(200);
		const main = mainOf(await response.text());
		expect(main).not.toContain('<form');
		expect(main).not.toContain('<input');
		expect(main).toContain('November');
		expect(main).toMatch(/data-value="bales"[^>]*>\s*377 bales/);
		const before = await farmSnapshot(db, farmId);
		expect((await reviewer.postForm(`/farms/${farmId}/herd?/save`, herdForm)).status).toBe(403);
		expect((await reviewer.postForm(`/farms/${farmId}/herd?/remove`, {})).status).toBe(403);
		expect(await farmSnapshot(db, farmId)).toEqual(before);
	});

	it('asks, then records that the farm keeps no cattle', async () => {
		const ask = await (await owner.fetch(`/farms/${farmId}/herd?confirm=remove`, html)).text();
		expect(ask).toContain('The farm keeps no cattle?');
		expect((await owner.postForm(`/farms/${farmId}/herd?/remove`, {})).status).toBe(303);
		expect(await herdRow()).toBeUndefined();
		const blank = await (await owner.fetch(`/farms/${farmId}/herd`, html)).text();
		expect(blank).toContain('No herd yet');
		expect(blank).toMatch(/data-value="bales"[^>]*>\s*— bales/);
		const none = await (await reviewer.fetch(`/farms/${farmId}/herd`, html)).text();
		expect(mainOf(none)).toContain('This farm keeps no herd.');
	});
});

describe('the people page', () => {
	it('adds people without JavaScript; the farm’s labour and the totals rows are the sums', async () => {
		const added = await owner.postForm(
			`/farms/${farmId}/people?/create`,
			personForm('Ida Lund', 'operator', 160)
		);
		expect(added.status).toBe(303);
		expect(added.headers.get('location')).toBe(`/farms/${farmId}/people?added=ida-lund`);
		await owner.postForm(`/farms/${farmId}/people?/create`, personForm('Per Lund', 'family', 40));
		await owner.postForm(
			`/farms/${farmId}/people?/create`,
			personForm('Hal Moe', 'hired', 25, '18.5')
		);
		expect(await personRow('Hal Moe')).toMatchObject({ role: 'hired', wageUsdPerHour: 18.5 });
		expect(await farmLabour()).toEqual(Array(12).fill(200));
		const page = await (await owner.fetch(`/farms/${farmId}/people`, html)).text();
		expect(page).toMatch(/data-testid="family-hours"[^]*?200[^]*?<\/tr>/);
		// 12 months × 200 h = 2,400 family hours a year; 12 × 25 = 300 hired
		expect(page).toMatch(/data-testid="family-hours"[^]*?2,400/);
		expect(page).toMatch(/data-testid="hired-hours"[^]*?300/);
		expect(page).toContain('after any off-farm job');
	});

	it('hired help without a wage comes back beside the wage, nothing saved', async () => {
		const before = await farmSnapshot(db, farmId);
		const response = await owner.postForm(
			`/farms/${farmId}/people?/create`,
			personForm('Sam Dahl', 'hired', 10)
		);
		expect(response.status).toBe(400);
		expect(await response.text()).toMatch(
			/data-error-for="wageUsdPerHour"[^>]*>\s*Give Sam Dahl's wage: hired help is paid by the hour.\s*</
		);
		// Ida 160 + Per 40 + 600 = 800 h in January, past the 744 a farm's month may hold.
		const tooMany = await owner.postForm(`/farms/${farmId}/people?/create`, {
			...personForm('Ola Lund', 'partner', 10),
			hoursAvailableByMonth: ['600', ...hours(10).slice(1)]
		});
		expect(tooMany.status).toBe(400);
		expect(await tooMany.text()).toContain(
			"Jan: The family's hours in January would be 800: a farm's labour is at most 744 hours a month."
		);
		expect(await farmSnapshot(db, farmId)).toEqual(before);
	});

	it('edits and deletes a person, summing the family again each time', async () => {
		const per = await personRow('Per Lund');
		const edit = await owner.postForm(
			`/farms/${farmId}/people/${per.id}?/update`,
			personForm('Per Lund', 'family', 60)
		);
		expect(edit.status).toBe(303);
		expect(await farmLabour()).toEqual(Array(12).fill(220));
		const gone = await owner.postForm(`/farms/${farmId}/people/${per.id}?/delete`, {});
		expect(gone.status).toBe(303);
		expect(await personRow('Per Lund')).toBeUndefined();
		expect(await farmLabour()).toEqual(Array(12).fill(160));
	});

	it('the settings page shows the family’s hours read-only and its save keeps them', async () => {
		const page = await (await owner.fetch(`/farms/${farmId}/settings`, html)).text();
		expect(page).toContain('data-family-hours');
		expect(page).toContain(`href="/farms/${farmId}/people"`);
		expect(page).not.toContain('name="labourHours"');
		const { labourHoursAvailableByMonth: _typed, ...settings } = farmSettings('Lund farm');
		const saved = await owner.postForm(`/farms/${farmId}/settings`, {
			...Object.fromEntries(Object.entries(settings).map(([k, v]) => [k, String(v)])),
			fixedCostsUsdPerYear: '0',
			labourHours: hours(5)
		});
		expect(saved.status).toBe(303);
		expect(await farmLabour()).toEqual(Array(12).fill(160));
	});

	it('a reviewer sees the people with no form or edit links, and may not post', async () => {
		const ida = await personRow('Ida Lund');
		const page = mainOf(await (await reviewer.fetch(`/farms/${farmId}/people`, html)).text());
		expect(page).toContain('Ida Lund');
		expect(page).not.toContain('<form');
		expect(page).not.toContain(`/people/${ida.id}`);
		const before = await farmSnapshot(db, farmId);
		const form = personForm('Not Mine', 'family', 10);
		expect((await reviewer.postForm(`/farms/${farmId}/people?/create`, form)).status).toBe(403);
		expect((await reviewer.fetch(`/farms/${farmId}/people/${ida.id}`, html)).status).toBe(403);
		const update = await reviewer.postForm(`/farms/${farmId}/people/${ida.id}?/update`, form);
		expect(update.status).toBe(403);
		const del = await reviewer.postForm(`/farms/${farmId}/people/${ida.id}?/delete`, {});
		expect(del.status).toBe(403);
		expect(await farmSnapshot(db, farmId)).toEqual(before);
	});
});
