// Monte Carlo runs as queued jobs: the start and job routes' answers and refusals against the tests'
// own server, then two more app servers of the built app, started here on their own queue schema
// (JOB_QUEUE_SCHEMA), sharing one queue: no job is run twice, and a job whose server stops mid-run
// is run again to the end when the server is back, with the same result as a run never stopped.
import { spawn, type ChildProcess } from 'node:child_process';
import { once } from 'node:events';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { testDb, testPool } from '../support/db';
import { farmFromScenario } from '../support/farms';
import { Client, registerUser, signedIn } from '../support/http';
import { demoUsers } from '../support/server';

const db = testDb();
const pool = testPool();
const queueSchema = 'pgboss_jobs_test';
let owner: Client;
let farmId: string;
let planId: string;
const servers = new Map<number, ChildProcess>();

type JobAnswer = {
	id: string;
	state: string;
	progress: { done: number; total: number | null; percent: number };
	attempts: number;
	result: { draws: number; seed: number; plan: { horizonAverage: unknown } } | null;
	error: string | null;
};

const riskPath = () => `/api/v1/farms/${farmId}/plans/${planId}/risk`;

async function startRun(client: Client, body: Record<string, unknown>) {
	const response = await client.json(riskPath(), 'POST', body);
	expect(response.status).toBe(202);
	return ((await response.json()) as { jobId: string }).jobId;
}

/** Jobs sent for this file's farm (other files, running at the same time, send their own). */
async function farmJobCount() {
	const { rows } = await pool.query(
		`SELECT count(*)::int AS n FROM pgboss.job WHERE data ->> 'farmId' = $1`,
		[farmId]
	);
	return rows[0].n as number;
}

async function readJob(client: Client, jobId: string): Promise<JobAnswer> {
	const response = await client.fetch(`/api/v1/jobs/${jobId}`);
	expect(response.status).toBe(200);
	return response.json();
}

async function until<T>(
	what: string,
	check: () => Promise<T | undefined>,
	seconds = 60,
	everyMs = 200
) {
	const end = Date.now() + seconds * 1000;
	while (Date.now() < end) {
		const found = await check();
		if (found !== undefined) return found;
		await new Promise((resolve) => setTimeout(resolve, everyMs));
	}
	throw new Error(`timed out waiting for ${what}`);
}

const finished = (client: Client, jobId: string, seconds = 60) =>
	until(
		`job ${jobId} to complete`,
		async () => {
			const job = await readJob(client, jobId);
			if (job.state === 'failed') throw new Error(`job ${jobId} failed: ${job.error}`);
			return job.state === 'completed' ? job : undefined;
		},
		seconds
	);

/** Another app server on `port`, working the test queue schema; answers once it serves pages. */
async function startServer(port: number) {
	const origin = `http://127.0.0.1:${port}`;
	const server = spawn(process.execPath, ['build'], {
		env: {
			...process.env,
			PORT: String(port),
			HOST: '127.0.0.1',
			ORIGIN: origin,
			JOB_QUEUE_SCHEMA: queueSchema
		},
		stdio: ['ignore', 'inherit', 'inherit']
	});
	servers.set(port, server);
	await until(`the app on ${origin}`, async () => {
		try {
			await fetch(origin, { redirect: 'manual', headers: { Connection: 'close' } });
			return true;
		} catch {
			return undefined;
		}
	});
	return origin;
}

async function stopServer(port: number) {
	const server = servers.get(port);
	if (!server || server.exitCode !== null) return;
	const exited = once(server, 'exit');
	server.kill('SIGTERM');
	await exited;
	if (servers.get(port) === server) servers.delete(port);
}

const basePort = Number(process.env.TEST_PORT) + 20;

beforeAll(async () => {
	({ owner, farmId } = await farmFromScenario(db, 'scenarios/wide-row-interseeded.json', 'jobs'));
	const { plans } = await (await owner.fetch(`/api/v1/farms/${farmId}/plans`)).json();
	planId = plans[0].id;
	await pool.query(`DROP SCHEMA IF EXISTS ${queueSchema} CASCADE`);
});

afterAll(async () => {
	for (const port of [...servers.keys()]) await stopServer(port);
	await pool.query(`DROP SCHEMA IF EXISTS ${queueSchema} CASCADE`);
});

describe('starting a run and reading it back', () => {
	it('answers 202 with the job, which runs to a result with its progress at 100 %', async () => {
		const response = await owner.json(riskPath(), 'POST', { draws: 2000, seed: 99 });
		expect(response.status).toBe(202);
		const body = await response.json();
		expect(response.headers.get('location')).toBe(`/api/v1/jobs/${body.jobId}`);
		expect(body).toMatchObject({ seed: 99, draws: 2000, href: `/api/v1/jobs/${body.jobId}` });
		const job = await finished(owner, body.jobId);
		expect(job.progress).toEqual({ done: 2000, total: 2000, percent: 100 });
		expect(job.attempts).toBe(1);
		expect(job.result).toMatchObject({ draws: 2000, seed: 99 });
	});

	it('refuses values out of range and crops the plan does not grow with 422, starting nothing', async () => {
		const before = await farmJobCount();
		const bad = await owner.json(riskPath(), 'POST', {
			draws: 50_001,
			seed: -1,
			sharedWeather: 1.5,
			crops: [{ crop: 'corn', yieldCvPercent: 51, priceCvPercent: 10, priceYieldCorrelation: -1.2 }]
		});
		expect(bad.status).toBe(422);
		const { issues } = await bad.json();
		expect(issues).toEqual(
			expect.arrayContaining([
				{ path: 'draws', message: 'The number of draws must be at most 50,000.' },
				{ path: 'seed', message: 'The seed must be at least 0.' },
				{
					path: 'crops.0.yieldCvPercent',
					message: 'The yield coefficient of variation must be at most 50 %.'
				},
				{
					path: 'crops.0.priceYieldCorrelation',
					message: 'The price–yield correlation must be at least -1.'
				},
				{
					path: 'sharedWeather',
					message: 'The correlation of two crops’ yields must be at most 1.'
				}
			])
		);
		const notGrown = await owner.json(riskPath(), 'POST', {
			crops: [{ crop: 'rye', yieldCvPercent: 20, priceCvPercent: 10, priceYieldCorrelation: 0 }]
		});
		expect(notGrown.status).toBe(422);
		expect((await notGrown.json()).issues[0].path).toBe('crops.0.crop');
		const notJson = await owner.json(riskPath(), 'POST', '{draws');
		expect(notJson.status).toBe(400);
		expect(await farmJobCount()).toBe(before);
	});

	it('answers 401 signed out and 404 to anyone outside the job’s farm', async () => {
		const jobId = await startRun(owner, { draws: 500, seed: 1 });
		expect((await new Client().fetch(`/api/v1/jobs/${jobId}`)).status).toBe(401);
		const { client: stranger } = await registerUser('jobs-stranger');
		const refused = await stranger.fetch(`/api/v1/jobs/${jobId}`);
		expect(refused.status).toBe(404);
		expect(await refused.json()).toEqual({ message: 'Job not found.' });
		// A member of another farm (the demo's lender) is a stranger here too.
		const lender = await signedIn(demoUsers.lender);
		expect((await lender.fetch(`/api/v1/jobs/${jobId}`)).status).toBe(404);
		expect((await owner.fetch(`/api/v1/jobs/${crypto.randomUUID()}`)).status).toBe(404);
		expect((await owner.fetch('/api/v1/jobs/not-a-job')).status).toBe(404);
		// Nor may a stranger start a run on the farm.
		expect((await stranger.json(riskPath(), 'POST', {})).status).toBe(404);
	});
});

// App servers start in seconds and the runs take seconds each: more time than one request needs.
describe('several app servers sharing one queue', { timeout: 120_000 }, () => {
	it('two workers take jobs from one queue and never run the same job twice', async () => {
		const [first, second] = await Promise.all([startServer(basePort), startServer(basePort + 1)]);
		const firstServer = servers.get(basePort)!;
		const secondServer = servers.get(basePort + 1)!;
		// The first server takes a long run and is frozen while it runs: it can take no other job, so
		// the runs sent meanwhile are the second server's. Without the freeze, which server takes which
		// job depends on timing alone, and one fast server may take them all.
		const longRun = await startRun(owner.on(first), { draws: 50_000, seed: 0 });
		await until(
			'the first server to take the long run',
			async () => {
				const { rows } = await pool.query(
					`SELECT 1 FROM job_progress WHERE job_id = $1 AND worker LIKE $2`,
					[longRun, `%:${firstServer.pid}`]
				);
				return rows.length ? true : undefined;
			},
			60,
			10
		);
		firstServer.kill('SIGSTOP');
		const viaSecond = owner.on(second);
		const shortRuns: string[] = [];
		try {
			for (let i = 1; i <= 4; i++)
				shortRuns.push(await startRun(viaSecond, { draws: 2_000, seed: i }));
			for (const jobId of shortRuns) await finished(viaSecond, jobId);
		} finally {
			firstServer.kill('SIGCONT');
		}
		// Either server answers for any job: they share the queue.
		await finished(viaSecond, longRun, 90);
		const jobIds = [longRun, ...shortRuns];
		const { rows } = await pool.query(
			`SELECT p.job_id AS "jobId", p.starts, p.worker, j.retry_count AS "retryCount"
			FROM job_progress p JOIN ${queueSchema}.job j ON j.id = p.job_id
			WHERE p.job_id = ANY($1::uuid[])`,
			[jobIds]
		);
		expect(rows).toHaveLength(5);
		// Each job ran once, on the server that took it.
		for (const row of rows) expect([row.starts, row.retryCount]).toEqual([1, 0]);
		const workerOf = new Map(rows.map((r) => [r.jobId as string, r.worker as string]));
		expect(workerOf.get(longRun)).toMatch(new RegExp(`:${firstServer.pid}$`));
		for (const jobId of shortRuns) {
			expect(workerOf.get(jobId)).toMatch(new RegExp(`:${secondServer.pid}$`));
		}
		// The tests' own server (the default queue schema) saw none of them.
		const mainQueue = await pool.query(
			'SELECT count(*)::int AS n FROM pgboss.job WHERE id = ANY($1::uuid[])',
			[jobIds]
		);
		expect(mainQueue.rows[0].n).toBe(0);
		await stopServer(basePort + 1);
	});

	it('a job whose server stops mid-run is run again when it is back, to the same result', async () => {
		const origin = servers.has(basePort)
			? `http://127.0.0.1:${basePort}`
			: await startServer(basePort);
		const client = owner.on(origin);
		const options = { draws: 50_000, seed: 4242 };
		const jobId = await startRun(client, options);
		// Watched in the database, not through the server, whose answers wait on the run's steps: a
		// run takes a second or two, and the server is frozen as soon as a worker has taken the job.
		await until(
			'a worker to take the job',
			async () => {
				const { rows } = await pool.query(
					`SELECT j.state FROM ${queueSchema}.job j JOIN job_progress p ON p.job_id = j.id
					WHERE j.id = $1 AND j.state = 'active' AND p.done < p.total`,
					[jobId]
				);
				return rows.length ? true : undefined;
			},
			60,
			10
		);
		// Frozen at once, then told to stop and let go: the run stops at its next step.
		servers.get(basePort)!.kill('SIGSTOP');
		const stopped = stopServer(basePort);
		servers.get(basePort)?.kill('SIGCONT');
		await stopped;
		// Stopped part-way: back in the queue to run again, with no result written.
		const { rows } = await pool.query(
			`SELECT state, output FROM ${queueSchema}.job WHERE id = $1`,
			[jobId]
		);
		expect(rows[0].state).toBe('retry');
		expect(rows[0].output).not.toHaveProperty('plan');

		const restarted = owner.on(await startServer(basePort));
		const job = await finished(restarted, jobId, 90);
		expect(job.attempts).toBe(2);
		expect(job.progress).toEqual({ done: 50_000, total: 50_000, percent: 100 });
		// The same seed run without a stop gives the same answer: the retried run started afresh.
		const again = await finished(restarted, await startRun(restarted, options), 90);
		expect(job.result).toEqual(again.result);
	});
});
