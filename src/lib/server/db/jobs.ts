import { eq, lt, sql } from 'drizzle-orm';
import type { Db, Tx } from './client';
import { jobProgress } from './schema';

/** A worker takes a job: progress back to zero and one more start counted (a retry counts again). */
export async function recordJobStart(db: Db | Tx, jobId: string, total: number, worker: string) {
	await db
		.insert(jobProgress)
		.values({ jobId, total, worker })
		.onConflictDoUpdate({
			target: jobProgress.jobId,
			set: {
				done: 0,
				total,
				worker,
				starts: sql`${jobProgress.starts} + 1`,
				updatedAt: sql`now()`
			}
		});
}

export async function saveJobProgress(db: Db | Tx, jobId: string, done: number) {
	await db
		.update(jobProgress)
		.set({ done, updatedAt: sql`now()` })
		.where(eq(jobProgress.jobId, jobId));
}

export async function findJobProgress(db: Db | Tx, jobId: string) {
	return db.query.jobProgress.findFirst({ where: eq(jobProgress.jobId, jobId) });
}

/** Progress rows of jobs the queue has long since purged. */
export async function deleteStaleJobProgress(db: Db | Tx, olderThanDays: number) {
	await db
		.delete(jobProgress)
		.where(lt(jobProgress.updatedAt, sql`now() - make_interval(days => ${olderThanDays})`));
}
