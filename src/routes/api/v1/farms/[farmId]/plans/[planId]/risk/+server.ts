import { json } from '@sveltejs/kit';
import { monteCarloRequestSchema } from '$lib/schemas/monte-carlo';
import { invalidInput, readJson } from '$lib/server/api';
import { requirePlanAccess } from '$lib/server/auth/access';
import { monteCarloJobData } from '$lib/server/jobs/monte-carlo';
import { sendJob } from '$lib/server/jobs/queue';
import type { RequestHandler } from './$types';

/**
 * Starts a Monte Carlo of the plan's crop prices and yields as a queued job (on the plan's newest
 * version, against the farm's reference plan): 202 with the job's id; read it back at
 * `/api/v1/jobs/[jobId]`. Anyone who may view the farm may start one: it changes no plan.
 */
export const POST: RequestHandler = async (event) => {
	const { farm, plan, user } = await requirePlanAccess(
		event,
		event.params.farmId,
		event.params.planId,
		'farm:view'
	);
	const body = await readJson(event.request);
	if (!body.ok) return body.response;
	const parsed = monteCarloRequestSchema.safeParse(body.body);
	if (!parsed.success) return invalidInput(parsed.error);
	const asked = await monteCarloJobData(farm, plan, user.id, parsed.data);
	if (!asked.ok) return asked.response;
	const jobId = await sendJob('monte-carlo', asked.data);
	const href = `/api/v1/jobs/${jobId}`;
	return json(
		{ jobId, href, seed: asked.data.options.seed, draws: asked.data.options.draws },
		{ status: 202, headers: { location: href } }
	);
};
