import { json } from '@sveltejs/kit';
import { optimiseOptionsSchema } from '$lib/schemas/optimise';
import { invalidInput, readJson } from '$lib/server/api';
import { requirePlanAccess } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import { optimiserLpFile } from '$lib/server/optimiser/optimise';
import { storedPlanDocument } from '$lib/server/plans';
import type { RequestHandler } from './$types';

/** The farm model for these options as a CPLEX LP file (a download), for any solver to check. */
export const POST: RequestHandler = async (event) => {
	const { farm, plan } = await requirePlanAccess(
		event,
		event.params.farmId,
		event.params.planId,
		'farm:view'
	);
	const body = await readJson(event.request);
	if (!body.ok) return body.response;
	const options = optimiseOptionsSchema.safeParse(body.body);
	if (!options.success) return invalidInput(options.error);
	const stored = await storedPlanDocument(db, farm, plan);
	if (!stored.ok) return stored.response;
	const lp = optimiserLpFile(stored.document, options.data);
	if (!lp.ok) {
		return json(
			{ message: 'The options do not fit the plan.', issues: lp.issues },
			{ status: 422 }
		);
	}
	const fileName = `${stored.document.plan.name.replace(/[^A-Za-z0-9]+/g, '-').toLowerCase()}-model.lp`;
	return new Response(lp.text, {
		headers: {
			'content-type': 'text/plain; charset=utf-8',
			'content-disposition': `attachment; filename="${fileName}"`
		}
	});
};
