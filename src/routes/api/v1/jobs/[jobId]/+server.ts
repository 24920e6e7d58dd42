import { json } from '@sveltejs/kit';
import { requireJobAccess } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import { findJobProgress } from '$lib/server/db/jobs';
import { jobAnswer } from '$lib/server/jobs/answer';
import type { RequestHandler } from './$types';

/** A queued job's state, progress and (once completed) result, for members of the job's farm. */
export const GET: RequestHandler = async (event) => {
	const { job } = await requireJobAccess(event, event.params.jobId);
	const progress = await findJobProgress(db, job.id);
	return json(jobAnswer(job, progress), { headers: { 'cache-control': 'no-store' } });
};
