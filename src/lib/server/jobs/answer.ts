import type { jobProgress } from '$lib/server/db/schema';
import type { QueueState, StoredJob } from './queue';

/** A job's state in plain words: waiting, running, waiting to run again, or ended. */
export const jobStates = [
	'queued',
	'running',
	'retrying',
	'completed',
	'failed',
	'cancelled'
] as const;
export type JobState = (typeof jobStates)[number];

const stateWords = new Map<QueueState, JobState>([
	['created', 'queued'],
	['active', 'running'],
	['retry', 'retrying'],
	['completed', 'completed'],
	['failed', 'failed'],
	['cancelled', 'cancelled']
]);

export interface JobAnswer {
	id: string;
	kind: StoredJob['kind'];
	state: JobState;
	farmId: string;
	planId: string;
	progress: { done: number; total: number | null; percent: number };
	/** Times a worker has started the job: more than one after a worker stopped mid-run. */
	attempts: number;
	createdAt: string;
	startedAt: string | null;
	completedAt: string | null;
	result: unknown;
	error: string | null;
}

/** What the job route answers: the queue's row, with the progress a worker saved. */
export function jobAnswer(
	job: StoredJob,
	progress: typeof jobProgress.$inferSelect | undefined
): JobAnswer {
	const state = stateWords.get(job.state) ?? 'failed';
	const total = progress?.total ?? null;
	const done = state === 'completed' ? (total ?? 0) : (progress?.done ?? 0);
	const output = job.output as { message?: unknown } | null;
	return {
		id: job.id,
		kind: job.kind,
		state,
		farmId: job.owner.farmId,
		planId: job.owner.planId,
		progress: { done, total, percent: total ? Math.round((done / total) * 1000) / 10 : 0 },
		attempts: progress?.starts ?? 0,
		createdAt: job.createdOn.toISOString(),
		startedAt: job.startedOn?.toISOString() ?? null,
		completedAt: job.completedOn?.toISOString() ?? null,
		result: state === 'completed' ? job.output : null,
		error:
			state === 'failed' || state === 'retrying'
				? typeof output?.message === 'string'
					? output.message
					: 'The run failed.'
				: null
	};
}
