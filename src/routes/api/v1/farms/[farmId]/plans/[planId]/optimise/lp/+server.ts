import { optimiseOptionsSchema } from '$lib/schemas/optimise';
import { optionsRefused } from '$lib/server/api';
import { requirePlanAccess } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import { optimiserLpFile } from '$lib/server/optimiser/optimise';
import { planDocumentRequest } from '$lib/server/plans';
import type { RequestHandler } from './$types';

/** The farm model for these options as a CPLEX LP file (a download), for any solver to check. */
export const POST: RequestHandler = async (event) => {
	const { farm, plan } = await requirePlanAccess(
		event,
		event.params.farmId,
		event.params.planId,
		'farm:view'
	);
	const asked = await planDocumentRequest(db, farm, plan, event.request, optimiseOptionsSchema);
	if (!asked.ok) return asked.response;
	const { body: options, document } = asked;
	const lp = optimiserLpFile(document, options);
	if (!lp.ok) {
		return optionsRefused(lp.issues);
	}
	const fileName = `${document.plan.name.replace(/[^A-Za-z0-9]+/g, '-').toLowerCase()}-model.lp`;
	return new Response(lp.text, {
		headers: {
			'content-type': 'text/plain; charset=utf-8',
			'content-disposition': `attachment; filename="${fileName}"`
		}
	});
};
