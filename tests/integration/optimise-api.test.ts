// The optimiser's routes: POST /api/v1/optimise on a plan file (the same answer as the command line),
// and on the seeded demo farm's plan the optimise, LP file and trade-off routes, for whoever may view
// the farm, saving nothing. LP files are checked with GLPK 5.0 glpsol (Debian package glpk-utils).
import { readFileSync } from 'node:fs';
import { mkdtemp, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { count, eq } from 'drizzle-orm';
import { beforeAll, describe, expect, it } from 'vitest';
import type { OptimiseResult, TradeOffLine } from '../../src/lib/engine/optimiser/types';
import { planVersions } from '../../src/lib/server/db/schema';
import { testDb } from '../support/db';
import { demoFarmId } from '../support/farms';
import { Client, signedIn } from '../support/http';
import { glpsol, relativeDifference } from '../support/optimiser';
import { runPlan } from '../support/plan-cli';
import { demoUsers } from '../support/server';

const db = testDb();
const scenario = (name: string) => JSON.parse(readFileSync(`scenarios/${name}.json`, 'utf8'));
type Issue = { path: string; message: string };

let owner: Client;
let lender: Client;
let stranger: Client;
let farmId: string;
let planId: string;

const optimiseUrl = (rest = '') => `/api/v1/farms/${farmId}/plans/${planId}/optimise${rest}`;

async function versionCount() {
	const [row] = await db
		.select({ n: count() })
		.from(planVersions)
		.where(eq(planVersions.planId, planId));
	return row.n;
}

/** The result without the time HiGHS took, which differs from run to run. */
function withoutTiming(result: OptimiseResult) {
	return { ...result, solveMs: 0 };
}

beforeAll(async () => {
	[owner, lender, stranger] = await Promise.all([
		signedIn(demoUsers.owner),
		signedIn(demoUsers.lender),
		// Owner of the other demo farm, not a member of Maple Coulee Farm.
		signedIn(demoUsers.birchHollowOwner)
	]);
	farmId = await demoFarmId(db, 'Maple Coulee Farm');
	const response = await owner.fetch(`/api/v1/farms/${farmId}/plans`);
	expect(response.status).toBe(200);
	const { plans } = (await response.json()) as { plans: { id: string; isReference: boolean }[] };
	planId = plans.find((p) => p.isReference)!.id;
});

describe('POST /api/v1/optimise', () => {
	it('answers what `npm run plan -- optimise` prints for the same plan and options', async () => {
		const options = {
			wholeFields: true,
			gapPercent: 0,
			limits: { nitrogenPurchasedLbPerYear: 45_000 }
		};
		const response = await lender.json('/api/v1/optimise', 'POST', {
			plan: scenario('reduced-n'),
			options
		});
		expect(response.status, await response.clone().text()).toBe(200);
		const result = (await response.json()) as OptimiseResult;
		expect(result.status).toBe('optimal');

		const cli = await runPlan(
			'optimise',
			'scenarios/reduced-n.json',
			'--options',
			await writeOptions(options)
		);
		expect(cli.code, cli.stderr).toBe(0);
		expect(withoutTiming(result)).toEqual(withoutTiming(JSON.parse(cli.stdout)));
	});

	it('answers 422 naming options.limits… for bad options, and plan.… for a bad plan', async () => {
		const badOptions = await lender.json('/api/v1/optimise', 'POST', {
			plan: scenario('reference'),
			options: { limits: { nitrogenPurchasedLbPerYear: -1, dieselGallonsPerYear: 'lots' } }
		});
		expect(badOptions.status).toBe(422);
		const paths = ((await badOptions.json()).issues as Issue[]).map((i) => i.path);
		expect(paths).toContain('options.limits.nitrogenPurchasedLbPerYear');
		expect(paths).toContain('options.limits.dieselGallonsPerYear');

		const unfit = await lender.json('/api/v1/optimise', 'POST', {
			plan: scenario('reference'),
			options: { limits: { rotationIds: ['no-such-rotation'] } }
		});
		expect(unfit.status).toBe(422);
		expect(((await unfit.json()).issues as Issue[]).map((i) => i.path)).toEqual([
			'options.limits.rotationIds.0'
		]);

		const plan = scenario('reference');
		plan.fields[1].acres = -2;
		const badPlan = await lender.json('/api/v1/optimise', 'POST', { plan });
		expect(badPlan.status).toBe(422);
		expect(((await badPlan.json()).issues as Issue[]).map((i) => i.path)).toContain(
			'plan.fields.1.acres'
		);
	});

	it('refuses anyone not signed in (401)', async () => {
		const response = await new Client().json('/api/v1/optimise', 'POST', {
			plan: scenario('reference')
		});
		expect(response.status).toBe(401);
	});
});

async function writeOptions(options: unknown): Promise<string> {
	const file = join(await mkdtemp(join(tmpdir(), 'optimise-api-')), 'options.json');
	await writeFile(file, JSON.stringify(options));
	return file;
}

describe('POST /api/v1/farms/{farmId}/plans/{planId}/optimise', () => {
	it('answers { result, current } on the demo farm and saves nothing', async () => {
		const before = await versionCount();
		const response = await owner.json(optimiseUrl(), 'POST', {});
		expect(response.status, await response.clone().text()).toBe(200);
		const { result, current } = (await response.json()) as {
			result: OptimiseResult;
			current: { netReturnUsd: number; years: OptimiseResult['years'] };
		};
		expect(result.status).toBe('optimal');
		expect(result.fields.length).toBeGreaterThan(0);
		expect(current.years).toHaveLength(result.years.length);
		expect(current.netReturnUsd).toBeCloseTo(
			current.years.reduce((s, y) => s + y.netReturnUsd, 0),
			6
		);
		// The best mix is at least as good as the plan as it stands (which is one of the mixes).
		expect(result.netReturnUsd!).toBeGreaterThanOrEqual(current.netReturnUsd - 1e-6);
		expect(await versionCount()).toBe(before);
	});

	it('answers a reviewer too, and a non-member as the other plan routes do', async () => {
		const reviewer = await lender.json(optimiseUrl(), 'POST', { wholeFields: true });
		expect(reviewer.status).toBe(200);
		expect(((await reviewer.json()) as { result: OptimiseResult }).result.wholeFields).toBe(true);

		const planRoute = await stranger.fetch(`/api/v1/farms/${farmId}/plans/${planId}`);
		expect([403, 404]).toContain(planRoute.status);
		for (const rest of ['', '/lp', '/trade-off']) {
			const refused = await stranger.json(optimiseUrl(rest), 'POST', {});
			expect(refused.status, rest).toBe(planRoute.status);
		}
		expect((await new Client().json(optimiseUrl(), 'POST', {})).status).toBe(401);
	});

	it('answers 422 naming limits… for bad options', async () => {
		const response = await owner.json(optimiseUrl(), 'POST', {
			limits: { familyLabourHoursByMonth: [100] }
		});
		expect(response.status).toBe(422);
		const paths = ((await response.json()).issues as Issue[]).map((i) => i.path);
		expect(paths.some((p) => p.startsWith('limits.familyLabourHoursByMonth'))).toBe(true);
	});

	it('…/optimise/lp answers an LP file glpsol solves to the objective the route answers', async () => {
		const options = { limits: { nitrogenPurchasedLbPerYear: 45_000 } };
		const before = await versionCount();
		const [lp, solved] = await Promise.all([
			lender.json(optimiseUrl('/lp'), 'POST', options),
			lender.json(optimiseUrl(), 'POST', options)
		]);
		expect(lp.status).toBe(200);
		expect(lp.headers.get('content-disposition')).toMatch(/^attachment; filename=".+\.lp"$/);
		const { result } = (await solved.json()) as { result: OptimiseResult };
		const glpk = await glpsol(await lp.text());
		expect(glpk.status).toBe('optimal');
		expect(relativeDifference(glpk.objective, result.objectiveUsd!)).toBeLessThan(1e-6);
		expect(await versionCount()).toBe(before);
	});

	it('…/optimise/trade-off streams NDJSON: progress, the points, then done', async () => {
		const before = await versionCount();
		const response = await lender.json(optimiseUrl('/trade-off'), 'POST', {
			sweep: { limit: 'family-labour', months: [10], from: 20, to: 400, points: 5 }
		});
		expect(response.status).toBe(200);
		expect(response.headers.get('content-type')).toContain('application/x-ndjson');
		const text = await response.text();
		expect(text.endsWith('\n')).toBe(true);
		const lines = text
			.trim()
			.split('\n')
			.map((line) => JSON.parse(line) as TradeOffLine);
		expect(lines[0]).toEqual({ type: 'progress', done: 0, total: 5 });
		expect(lines.filter((l) => l.type === 'point')).toHaveLength(5);
		expect(lines.at(-1)!.type).toBe('done');
		expect(await versionCount()).toBe(before);

		const refused = await lender.json(optimiseUrl('/trade-off'), 'POST', {
			sweep: { limit: 'family-labour', from: 400, to: 20 }
		});
		expect(refused.status).toBe(422);
		const paths = ((await refused.json()).issues as Issue[]).map((i) => i.path);
		expect(paths).toContain('sweep.months');
	});
});
