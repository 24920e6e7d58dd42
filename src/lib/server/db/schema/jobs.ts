import { integer, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core';

/**
 * How far each queued job has got. The queue (pg-boss, in its own schema) holds the job itself, its
 * state and its result; this row holds what the queue has no place for: draws done of the total, and
 * how many times a worker has started the job (a second start is a retry after a stopped worker).
 * Keyed by the queue's job id; no foreign key, since the queue's rows live and are purged elsewhere.
 */
export const jobProgress = pgTable('job_progress', {
	jobId: uuid().primaryKey(),
	done: integer().notNull().default(0),
	total: integer().notNull(),
	starts: integer().notNull().default(1),
	/** The worker that started it last: host and process id. */
	worker: text().notNull(),
	updatedAt: timestamp({ withTimezone: true }).notNull().defaultNow()
});
