import { error } from '@sveltejs/kit';
import { requireFarmAccess } from '$lib/server/auth/access';
import { uploads } from '$lib/server/uploads';
import type { RequestHandler } from './$types';

/** The upload's template: its header row and one example row, ready to fill in a spreadsheet. */
export const GET: RequestHandler = async (event) => {
	await requireFarmAccess(event, event.params.farmId, 'farm:edit');
	const upload = uploads.get(event.params.kind);
	if (!upload) error(404, 'There is no such upload.');
	return new Response(upload.template(), {
		headers: {
			'content-type': 'text/csv; charset=utf-8',
			'content-disposition': `attachment; filename="furrowcast-${event.params.kind}.csv"`
		}
	});
};
