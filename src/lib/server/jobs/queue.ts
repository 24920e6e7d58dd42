// The job queue: pg-boss on the app's own PostgreSQL, in a schema of its own (`pgboss`, or
// JOB_QUEUE_SCHEMA). Every app server sends jobs to it and works them, so a run outlives the page that
// started it, and any server answers how far it has got.
import { hostname } from 'node:os';
import PgBoss from 'pg-boss';
import { sql } from 'drizzle-orm';
import { z } from 'zod';
import { env } from '$env/dynamic/private';
import { db } from '$lib/server/db';

/** The kinds of job, each a queue of its own. */
export const jobKinds = ['monte-carlo', 'trade-off'] as const;
export type JobKind = (typeof jobKinds)[number];

/** What every job carries besides its own input: whose it is, for the job route's guard. */
export interface JobOwner {
	farmId: string;
	planId: string;
	userId: string;
}

/** This process as a worker, as the progress table names it. */
export const workerName = `${hostname()}:${process.pid}`;

// A run that has not answered in 5 minutes is failed and retried (a worker killed without a word
// leaves its job active until then); three retries, two seconds apart.
const queueOptions = {
	retryLimit: 3,
	retryDelay: 2,
	expireInSeconds: 300,
	retentionDays: 7
} as const;

let started: Promise<PgBoss> | undefined;

const queueSchema = () => env.JOB_QUEUE_SCHEMA || 'pgboss';

/** The queue, started once per process (schema created or migrated by pg-boss on first start). */
export function jobQueue(): Promise<PgBoss> {
	started ??= (async () => {
		if (!env.DATABASE_URL) throw new Error('DATABASE_URL is not set: the job queue needs it');
		const boss = new PgBoss({
			connectionString: env.DATABASE_URL,
			schema: queueSchema(),
			application_name: 'furrowcast-jobs',
			max: 4,
			// Finished jobs stay readable for a week (pg-boss archives them after 12 hours).
			deleteAfterDays: 7
		});
		boss.on('error', (error) => console.error('job queue:', error));
		await boss.start();
		for (const kind of jobKinds) await ensureQueue(boss, kind);
		return boss;
	})();
	return started;
}

/**
 * Creates a queue unless it exists. Servers starting together race to create it, and PostgreSQL can end
 * the race with a deadlock error for one of them: that one looks again rather than fail its start.
 */
async function ensureQueue(boss: PgBoss, kind: JobKind) {
	for (let attempt = 1; ; attempt++) {
		if (await boss.getQueue(kind)) return;
		try {
			await boss.createQueue(kind, { name: kind, ...queueOptions });
			return;
		} catch (error) {
			if (attempt >= 5) throw error;
			await new Promise((resolve) => setTimeout(resolve, 100 * attempt));
		}
	}
}

/** Stops the queue: workers stop taking jobs, a job still running is failed so that it is retried. */
export async function stopJobQueue() {
	if (!started) return;
	const boss = await started.catch(() => undefined);
	started = undefined;
	await boss?.stop({ graceful: true, timeout: 5000 });
}

/** This server's own worker of each queue, woken when this server sends a job (others poll). */
const localWorkers = new Map<JobKind, string>();

export function registerLocalWorker(kind: JobKind, workerId: string) {
	localWorkers.set(kind, workerId);
}

export async function sendJob<T extends object>(kind: JobKind, data: T & JobOwner) {
	const boss = await jobQueue();
	const id = await boss.send(kind, data);
	if (!id) throw new Error(`The job queue refused a ${kind} job`);
	const worker = localWorkers.get(kind);
	if (worker) boss.notifyWorker(worker);
	return id;
}

export type QueueState = 'created' | 'retry' | 'active' | 'completed' | 'cancelled' | 'failed';

export interface StoredJob {
	id: string;
	kind: JobKind;
	state: QueueState;
	owner: JobOwner;
	data: Record<string, unknown>;
	output: unknown;
	retryCount: number;
	createdOn: Date;
	startedOn: Date | null;
	completedOn: Date | null;
}

const jobIdSchema = z.uuid();

/** A job of any kind by its id, finished or not (archived jobs too); undefined for any other id. */
export async function findJob(jobId: string): Promise<StoredJob | undefined> {
	if (!jobIdSchema.safeParse(jobId).success) return undefined;
	const boss = await jobQueue();
	for (const kind of jobKinds) {
		const job = await boss.getJobById<JobOwner & Record<string, unknown>>(kind, jobId, {
			includeArchive: true
		});
		if (!job) continue;
		return {
			id: job.id,
			kind,
			state: job.state,
			owner: { farmId: job.data.farmId, planId: job.data.planId, userId: job.data.userId },
			data: job.data,
			output: job.output ?? null,
			retryCount: job.retryCount,
			createdOn: job.createdOn,
			startedOn: job.startedOn ?? null,
			completedOn: job.completedOn ?? null
		};
	}
	return undefined;
}

export interface FinishedJob {
	id: string;
	completedOn: Date;
	output: unknown;
}

/**
 * The newest completed job of a kind run on a plan, preferring one whose output names `version` as its
 * plan version: that version's newest run when there is one, else the plan's newest run of any version
 * (the caller tells them apart by the output). Jobs the queue has archived count; those it has deleted
 * (a week after they end) do not. The plan is looked up in the job's data: a scan of the kind's jobs,
 * few while the queue keeps a week of them.
 */
export async function findNewestCompletedJob(
	kind: JobKind,
	planId: string,
	version: number
): Promise<FinishedJob | undefined> {
	await jobQueue(); // the queue's tables exist once it has started
	const schema = sql.identifier(queueSchema());
	const { rows } = await db.execute<{ id: string; completed_on: Date; output: unknown }>(sql`
		SELECT id, completed_on, output FROM (
			SELECT id, completed_on, output, data FROM ${schema}.job
			WHERE name = ${kind} AND state = 'completed'
			UNION ALL
			SELECT id, completed_on, output, data FROM ${schema}.archive
			WHERE name = ${kind} AND state = 'completed'
		) finished
		WHERE data ->> 'planId' = ${planId}
		ORDER BY (output ->> 'planVersion') = ${String(version)} DESC, completed_on DESC
		LIMIT 1`);
	const row = rows[0];
	return row && { id: row.id, completedOn: new Date(row.completed_on), output: row.output };
}
