// The workers each app server runs (started from hooks.server.ts `init`, never while building): one per
// queue, taking one job at a time. On `sveltekit:shutdown` they stop taking jobs; a job under way stops
// at its next step and is failed, so the queue gives it to another worker (or this one, restarted).
import type PgBoss from 'pg-boss';
import { db } from '$lib/server/db';
import { deleteStaleJobProgress } from '$lib/server/db/jobs';
import { runMonteCarloJob, type MonteCarloJobData } from './monte-carlo';
import { runTradeOffJob, type TradeOffJobData } from './trade-off';
import { jobQueue, registerLocalWorker, stopJobQueue } from './queue';

let stopping = false;
let workers: Promise<void> | undefined;

async function startWorkers(boss: PgBoss) {
	const workerId = await boss.work<MonteCarloJobData>(
		'monte-carlo',
		{ pollingIntervalSeconds: 1, batchSize: 1 },
		async ([job]) => runMonteCarloJob(job.id, job.data, () => stopping)
	);
	registerLocalWorker('monte-carlo', workerId);
	const tradeOffWorkerId = await boss.work<TradeOffJobData>(
		'trade-off',
		{ pollingIntervalSeconds: 1, batchSize: 1 },
		async ([job]) => runTradeOffJob(job.id, job.data, () => stopping)
	);
	registerLocalWorker('trade-off', tradeOffWorkerId);
	// pg-boss deletes jobs a week after they end; their progress rows go a week later.
	await deleteStaleJobProgress(db, 14);
}

/** Starts this server's workers once; stops them when the server shuts down. */
export function startJobWorkers(): Promise<void> {
	workers ??= (async () => {
		process.once('sveltekit:shutdown', () => {
			stopping = true;
			stopJobQueue().catch((error) => console.error('job queue: stopping failed', error));
		});
		await startWorkers(await jobQueue());
	})();
	return workers;
}
