import { json } from '@sveltejs/kit';
import { tradeOffSchema } from '$lib/schemas/optimise';
import { requirePlanAccess } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import { sendJob } from '$lib/server/jobs/queue';
import { tradeOffJobData } from '$lib/server/jobs/trade-off';
import { planDocumentRequest } from '$lib/server/plans';
import type { RequestHandler } from './$types';

/**
 * Starts a trade-off curve (the body and refusals of `…/optimise/trade-off`) as a queued job on the
 * plan's newest version: 202 with the job's id; read its progress and points back at
 * `/api/v1/jobs/[jobId]`. Anyone who may view the farm may start one: it changes no plan.
 */
export const POST: RequestHandler = async (event) => {
	const { farm, plan, user } = await requirePlanAccess(
		event,
		event.params.farmId,
		event.params.planId,
		'farm:view'
	);
	const asked = await planDocumentRequest(db, farm, plan, event.request, tradeOffSchema);
	if (!asked.ok) return asked.response;
	const job = tradeOffJobData(farm.id, plan, user.id, asked.body, asked.document);
	if (!job.ok) return job.response;
	const jobId = await sendJob('trade-off', job.data);
	const href = `/api/v1/jobs/${jobId}`;
	return json(
		{ jobId, href, points: job.data.request.sweep.points },
		{ status: 202, headers: { location: href } }
	);
};
