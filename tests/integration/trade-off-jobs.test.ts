// The optimiser's trade-off curve as a queued job: started on a farm of the test's own, read back
// through the job route, and compared point by point with the streamed route's answer to the same body
// (both solve the same model with HiGHS; only the time each solve took may differ). Refusals: signed
// out 401, a non-member 404 on both routes, a bad body 422 with no job started.
import { beforeAll, describe, expect, it } from 'vitest';
import type {
	OptimiseResult,
	TradeOffLine,
	TradeOffPoint
} from '../../src/lib/engine/optimiser/types';
import { testDb, testPool } from '../support/db';
import { farmFromScenario } from '../support/farms';
import { Client, registerUser, signedIn } from '../support/http';
import { demoUsers } from '../support/server';

const db = testDb();
const pool = testPool();
let owner: Client;
let farmId: string;
let planId: string;

type Issue = { path: string; message: string };
type JobAnswer = {
	id: string;
	kind: string;
	state: string;
	planId: string;
	progress: { done: number; total: number | null; percent: number };
	attempts: number;
	result: {
		planVersion: number;
		points: TradeOffPoint[];
		current: { limit: number; netReturnUsd: number };
	} | null;
	error: string | null;
};

const streamUrl = () => `/api/v1/farms/${farmId}/plans/${planId}/optimise/trade-off`;
const jobsUrl = () => `${streamUrl()}/jobs`;
const body = { sweep: { limit: 'family-labour', months: [10], from: 20, to: 400, points: 5 } };

/** A point without the time HiGHS took, which differs from run to run. */
const withoutTiming = (point: TradeOffPoint) => ({
	...point,
	result: { ...point.result, solveMs: 0 } satisfies OptimiseResult
});

async function readJob(client: Client, jobId: string): Promise<JobAnswer> {
	const response = await client.fetch(`/api/v1/jobs/${jobId}`);
	expect(response.status).toBe(200);
	return response.json();
}

async function finished(client: Client, jobId: string, seconds = 120) {
	const end = Date.now() + seconds * 1000;
	while (Date.now() < end) {
		const job = await readJob(client, jobId);
		if (job.state === 'failed') throw new Error(`job ${jobId} failed: ${job.error}`);
		if (job.state === 'completed') return job;
		await new Promise((resolve) => setTimeout(resolve, 250));
	}
	throw new Error(`timed out waiting for job ${jobId}`);
}

async function tradeOffJobCount() {
	const { rows } = await pool.query(
		"SELECT count(*)::int AS n FROM pgboss.job WHERE name = 'trade-off' AND data ->> 'farmId' = $1",
		[farmId]
	);
	return rows[0].n as number;
}

beforeAll(async () => {
	({ owner, farmId } = await farmFromScenario(db, 'scenarios/reference.json', 'trade-off-jobs'));
	const { plans } = await (await owner.fetch(`/api/v1/farms/${farmId}/plans`)).json();
	planId = plans[0].id;
});

describe('the trade-off curve as a job', { timeout: 180_000 }, () => {
	it('answers 202 with the job, whose points are the streamed route’s for the same body', async () => {
		const started = await owner.json(jobsUrl(), 'POST', body);
		expect(started.status).toBe(202);
		const { jobId, href, points } = await started.json();
		expect(href).toBe(`/api/v1/jobs/${jobId}`);
		expect(started.headers.get('location')).toBe(href);
		expect(points).toBe(5);

		const streamed = await owner.json(streamUrl(), 'POST', body);
		expect(streamed.status).toBe(200);
		const lines = (await streamed.text())
			.trim()
			.split('\n')
			.map((line) => JSON.parse(line) as TradeOffLine);
		const streamedPoints = lines
			.flatMap((l) => (l.type === 'point' ? [l] : []))
			.sort((a, b) => a.index - b.index)
			.map((l) => l.point);
		const done = lines.at(-1)!;
		expect(done.type).toBe('done');

		const job = await finished(owner, jobId);
		expect(job).toMatchObject({ kind: 'trade-off', planId, attempts: 1, error: null });
		expect(job.progress).toEqual({ done: 5, total: 5, percent: 100 });
		const result = job.result!;
		expect(result.points).toHaveLength(5);
		// Not a curve of refusals only: some points have a mix that keeps every limit.
		expect(result.points.some((p) => p.result.netReturnUsd !== null)).toBe(true);
		// Evenly spaced limits from 20 to 400 h over 5 points: 20 + 95 k (arithmetic, k = 0…4).
		expect(result.points.map((p) => p.limit)).toEqual([20, 115, 210, 305, 400]);
		expect(result.points.map(withoutTiming)).toEqual(streamedPoints.map(withoutTiming));
		expect(result.current).toEqual(done.type === 'done' ? done.current : null);
		expect(result.planVersion).toBe(1);
	});

	it('refuses a bad body with 422 naming each problem, starting nothing', async () => {
		const before = await tradeOffJobCount();
		const noMonths = await owner.json(jobsUrl(), 'POST', {
			sweep: { limit: 'family-labour', from: 400, to: 20 }
		});
		expect(noMonths.status).toBe(422);
		const paths = ((await noMonths.json()).issues as Issue[]).map((i) => i.path);
		expect(paths).toEqual(expect.arrayContaining(['sweep.months', 'sweep.to']));
		const tooMany = await owner.json(jobsUrl(), 'POST', {
			sweep: { limit: 'nitrogen', from: 0, to: 100, points: 61 }
		});
		expect(tooMany.status).toBe(422);
		expect((await tooMany.json()).issues).toContainEqual({
			path: 'sweep.points',
			message: expect.stringContaining('at most 60')
		});
		expect((await owner.json(jobsUrl(), 'POST', '{sweep')).status).toBe(400);
		expect(await tradeOffJobCount()).toBe(before);
	});

	it('answers 401 signed out and 404 to anyone outside the farm, on both routes', async () => {
		const started = await owner.json(jobsUrl(), 'POST', body);
		expect(started.status).toBe(202);
		const { jobId } = await started.json();
		expect((await new Client().json(jobsUrl(), 'POST', body)).status).toBe(401);
		expect((await new Client().fetch(`/api/v1/jobs/${jobId}`)).status).toBe(401);
		const { client: stranger } = await registerUser('trade-off-jobs-stranger');
		expect((await stranger.json(jobsUrl(), 'POST', body)).status).toBe(404);
		const refused = await stranger.fetch(`/api/v1/jobs/${jobId}`);
		expect(refused.status).toBe(404);
		expect(await refused.json()).toEqual({ message: 'Job not found.' });
		// A member of another farm (the demo's lender) is a stranger here too.
		const lender = await signedIn(demoUsers.lender);
		expect((await lender.json(jobsUrl(), 'POST', body)).status).toBe(404);
		expect((await lender.fetch(`/api/v1/jobs/${jobId}`)).status).toBe(404);
		await finished(owner, jobId);
	});
});
