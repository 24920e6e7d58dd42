// The break-even, sensitivity and cash-flow routes on a farm of the test's own (the demo reference plan
// imported): refusals (401 signed out, 404 for a non-member or another farm's plan, 422 for bad query
// values), answers equal to the engine's on the plan file the farm makes, and the farm's cash-flow
// settings saved from the cash-flow page by an owner only, refused whole when a value is out of range.
import { eq } from 'drizzle-orm';
import { beforeAll, describe, expect, it } from 'vitest';
import { evaluatePlan } from '../../src/lib/engine';
import { breakEven } from '../../src/lib/engine/risk/break-even';
import { cashFlow } from '../../src/lib/engine/risk/cash-flow';
import { sensitivity } from '../../src/lib/engine/risk/sensitivity';
import { parsePlanDocument, type PlanDocument } from '../../src/lib/schemas/plan-file';
import { farmCashFlowSettings } from '../../src/lib/server/db/schema';
import { testDb } from '../support/db';
import { demoFarmId, farmFromScenario } from '../support/farms';
import { formatUsd } from '../../src/lib/format';
import { Client, newUser } from '../support/http';
import { reviewerOf } from './farm-setup-support';

const db = testDb();

let owner: Client;
let lender: Client;
let stranger: Client;
let farmId: string;
let planId: string;
let document: PlanDocument;

const url = (route: string, query = '') =>
	`/api/v1/farms/${farmId}/plans/${planId}/${route}${query}`;
/** The same JSON the route answers: numbers as JSON carries them. */
const asJson = (value: unknown) => JSON.parse(JSON.stringify(value));

function flowOf(settings: {
	startingCashUsd: number;
	minimumBalanceUsd: number;
	saleMonths: { crop: string; month: number }[];
}) {
	return cashFlow(evaluatePlan(document), {
		startingCashUsd: settings.startingCashUsd,
		minimumBalanceUsd: settings.minimumBalanceUsd,
		interestRatePercent: document.farm.interestRatePercent,
		saleMonthByCrop: new Map(settings.saleMonths.map((s) => [s.crop, s.month])),
		feedingSeasonStartMonth: document.herd?.feedingSeasonStartMonth ?? null
	});
}

beforeAll(async () => {
	({ owner, farmId } = await farmFromScenario(db, 'scenarios/reference.json', 'risk-api'));
	[lender, stranger] = await Promise.all([
		reviewerOf(db, farmId, 'risk-lender'),
		newUser('risk-stranger')
	]);
	const plans = await owner.fetch(`/api/v1/farms/${farmId}/plans`);
	planId = ((await plans.json()) as { plans: { id: string }[] }).plans[0].id;
	// The plan file the farm makes of the plan: what the routes evaluate.
	const file = await owner.fetch(`/api/v1/farms/${farmId}/plans/${planId}/file`);
	expect(file.status).toBe(200);
	const parsed = parsePlanDocument(await file.json());
	if (!parsed.ok) throw new Error(JSON.stringify(parsed.issues));
	document = parsed.plan;
});

describe('refusals', () => {
	const routes = ['break-even', 'sensitivity', 'cash-flow'];

	it.each(routes)(
		'%s: 401 signed out, 404 to a non-member and for another farm’s plan',
		async (route) => {
			expect((await new Client().fetch(url(route))).status).toBe(401);
			expect((await stranger.fetch(url(route))).status).toBe(404);
			const demoFarm = await demoFarmId(db, 'Maple Coulee Farm');
			const otherFarm = await owner.fetch(`/api/v1/farms/${demoFarm}/plans/${planId}/${route}`);
			expect(otherFarm.status).toBe(404);
			const noPlan = await owner.fetch(
				`/api/v1/farms/${farmId}/plans/00000000-0000-4000-8000-000000000000/${route}`
			);
			expect(noPlan.status).toBe(404);
		}
	);

	it('422 for sensitivity steps out of range, naming each', async () => {
		const response = await lender.fetch(url('sensitivity', '?steps=0,150'));
		expect(response.status).toBe(422);
		expect(await response.json()).toEqual({
			message: 'The input is not valid.',
			issues: [
				{ path: 'steps.0', message: 'A sensitivity step of 0 % moves nothing: leave it out.' },
				{ path: 'steps.1', message: 'A sensitivity step must be at most 100 %.' }
			]
		});
		const unknown = await lender.fetch(url('sensitivity', '?step=10'));
		expect(unknown.status).toBe(422);
	});

	it('422 for a cash-flow year outside the plan or not a year', async () => {
		const outside = await lender.fetch(url('cash-flow', '?year=2040'));
		expect(outside.status).toBe(422);
		expect(await outside.json()).toEqual({
			message: 'The input is not valid.',
			issues: [{ path: 'year', message: '2040 is not a year of this plan: it runs 2027–2031.' }]
		});
		const text = await lender.fetch(url('cash-flow', '?year=next'));
		expect(text.status).toBe(422);
		expect(((await text.json()) as { issues: { path: string }[] }).issues[0].path).toBe('year');
	});
});

describe('answers', () => {
	it('break-even: the engine’s, for a reviewer', async () => {
		const response = await lender.fetch(url('break-even'));
		expect(response.status).toBe(200);
		const body = await response.json();
		expect(body.plan).toMatchObject({ id: planId, startYear: 2027, years: 5 });
		expect(body.breakEven).toEqual(asJson(breakEven(evaluatePlan(document))));
		expect(body.breakEven.years[0].crops.map((c: { crop: string }) => c.crop).sort()).toEqual([
			'corn',
			'soybean'
		]);
	});

	it('sensitivity: the engine’s for the steps asked, ±10 % and ±20 % by default', async () => {
		const asked = await lender.fetch(url('sensitivity', '?steps=-15,5'));
		expect(asked.status).toBe(200);
		expect((await asked.json()).sensitivity).toEqual(asJson(sensitivity(document, [-15, 5])));
		const byDefault = await lender.fetch(url('sensitivity'));
		const body = await byDefault.json();
		expect(body.sensitivity.stepsPercent).toEqual([-20, -10, 10, 20]);
		expect(body.sensitivity.rows[0].largestChangeUsd).toBeGreaterThan(0);
	});

	it('cash flow: the engine’s from the defaults, every year or one', async () => {
		const defaults = { startingCashUsd: 0, minimumBalanceUsd: 0, saleMonths: [] };
		const all = await lender.fetch(url('cash-flow'));
		expect(all.status).toBe(200);
		const body = await all.json();
		expect(body.settings).toEqual(defaults);
		expect(body.cashFlow).toEqual(asJson(flowOf(defaults)));
		expect(body.cashFlow.years).toHaveLength(5);

		const one = await (await lender.fetch(url('cash-flow', '?year=2028'))).json();
		expect(one.cashFlow.years).toEqual([body.cashFlow.years[1]]);
		expect(one.cashFlow.peakLoanUsd).toBe(body.cashFlow.peakLoanUsd);
	});
});

describe('the farm’s cash-flow settings', () => {
	const page = () => `/farms/${farmId}/plans/${planId}/cash-flow`;
	const good = {
		startingCashUsd: '40,000',
		minimumBalanceUsd: '10000',
		'saleMonth:corn': '12',
		'saleMonth:soybean': ''
	};

	it('are refused to a reviewer and refused whole when a value is out of range', async () => {
		expect((await lender.postForm(page(), good)).status).toBe(403);
		const bad = await owner.action(page(), {
			...good,
			startingCashUsd: '-5',
			'saleMonth:corn': '13'
		});
		expect(bad).toMatchObject({ type: 'failure', status: 400 });
		expect(bad.data).toContain('The starting cash must be at least $0.');
		expect(bad.data).toContain('The sale month must be a month from 1 (January) to 12 (December).');
		const rows = await db
			.select()
			.from(farmCashFlowSettings)
			.where(eq(farmCashFlowSettings.farmId, farmId));
		expect(rows).toEqual([]);
	});

	it('saved by an owner, move the cash flow the API answers', async () => {
		const saved = await owner.action(page(), good);
		expect(saved).toMatchObject({ type: 'redirect', status: 303 });
		const settings = {
			startingCashUsd: 40_000,
			minimumBalanceUsd: 10_000,
			saleMonths: [{ crop: 'corn', month: 12 }]
		};
		const body = await (await lender.fetch(url('cash-flow'))).json();
		expect(body.settings).toEqual(settings);
		expect(body.cashFlow).toEqual(asJson(flowOf(settings)));
		// Corn stored to December: its sales land in December of every year, and nothing below the minimum.
		for (const year of body.cashFlow.years) {
			expect(year.lines[0].byMonthUsd[11]).toBeGreaterThan(0);
			for (const month of year.months)
				expect(month.closingBalanceUsd).toBeGreaterThanOrEqual(10_000 - 1e-6);
		}
	});

	it('stand two plans side by side on the cash-flow page: the same plan, the same peak', async () => {
		const copied = await owner.json(`/api/v1/farms/${farmId}/plans/${planId}/copy`, 'POST', {
			name: 'Copy for the lender'
		});
		expect(copied.status).toBe(201);
		const copy = ((await copied.json()) as { plan: { id: string } }).plan.id;
		const html = await (
			await lender.fetch(`${page()}?against=${copy}`, { headers: { Accept: 'text/html' } })
		).text();
		const peak = (await (await lender.fetch(url('cash-flow'))).json()).cashFlow.peakLoanUsd;
		const row = /<tr data-row="compare-horizon"[\s\S]*?<\/tr>/.exec(html)?.[0] ?? '';
		// This plan's peak, the copy's, and no difference between them.
		expect(row.split(formatUsd(peak)).length - 1).toBe(2);
		expect(row).toContain('$0');
		expect(html).toContain('Copy for the lender');
	});
});
