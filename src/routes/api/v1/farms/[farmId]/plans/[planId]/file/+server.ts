import { error, json } from '@sveltejs/kit';
import { resultsQuerySchema } from '$lib/schemas/plans';
import { invalidInput } from '$lib/server/api';
import { requirePlanAccess } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import { exportPlanDocument } from '$lib/server/db/plan-documents';
import { findPlanVersion } from '$lib/server/db/plans';
import type { RequestHandler } from './$types';

/** The plan file of the newest version, or `?version=`, as a download named after the plan. */
export const GET: RequestHandler = async (event) => {
	const { plan } = await requirePlanAccess(
		event,
		event.params.farmId,
		event.params.planId,
		'farm:view'
	);
	const query = resultsQuerySchema
		.pick({ version: true })
		.safeParse(Object.fromEntries(event.url.searchParams));
	if (!query.success) return invalidInput(query.error);
	const version = query.data.version ?? plan.currentVersion;
	if (!(await findPlanVersion(db, plan.id, version))) error(404, 'Plan version not found.');
	const fileName = `${plan.name.replace(/[^A-Za-z0-9-]+/g, '-').replace(/^-|-$/g, '') || 'plan'}-v${version}.json`;
	return json(await exportPlanDocument(db, plan.id, version), {
		headers: { 'Content-Disposition': `attachment; filename="${fileName}"` }
	});
};
