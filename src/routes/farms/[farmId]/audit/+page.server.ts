import { z } from 'zod';
import { describeAuditEntry } from '$lib/audit-words';
import { requireFarmAccess } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import { listAuditEntries, listAuditFilters } from '$lib/server/db/audit';
import type { PageServerLoad } from './$types';

const pageSize = 200;
// The filters are view state in the URL; a value that is not an id filters nothing.
const filterSchema = z.object({
	person: z.uuid().optional().catch(undefined),
	plan: z.uuid().optional().catch(undefined),
	before: z.coerce.number().int().positive().optional().catch(undefined)
});

// The farm's record for its owners: who did what and when, newest first, by person and by plan.
export const load = (async (event) => {
	const { farm } = await requireFarmAccess(event, event.params.farmId, 'farm:audit');
	const filter = filterSchema.parse(Object.fromEntries(event.url.searchParams));
	const [entries, filters] = await Promise.all([
		listAuditEntries(db, farm.id, {
			userId: filter.person,
			planId: filter.plan,
			beforeId: filter.before,
			limit: pageSize + 1
		}),
		listAuditFilters(db, farm.id)
	]);
	const shown = entries.slice(0, pageSize);
	return {
		farm: { id: farm.id, name: farm.name },
		filter: { person: filter.person ?? '', plan: filter.plan ?? '' },
		filters,
		entries: shown.map((entry) => {
			const detail = entry.detail as Record<string, unknown>;
			return {
				id: entry.id,
				at: entry.at,
				by: entry.by,
				action: entry.action,
				what: describeAuditEntry(entry.action, detail),
				planId: typeof detail.planId === 'string' ? detail.planId : null,
				version: typeof detail.version === 'number' ? detail.version : null
			};
		}),
		olderFrom: entries.length > pageSize ? shown.at(-1)!.id : null
	};
}) satisfies PageServerLoad;
