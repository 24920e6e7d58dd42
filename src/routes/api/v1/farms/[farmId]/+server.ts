import { json } from '@sveltejs/kit';
import { farmSchema } from '$lib/schemas/farm';
import { invalidInput, readJson } from '$lib/server/api';
import { requireFarmAccess } from '$lib/server/auth/access';
import { updateFarm } from '$lib/server/db/farms';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = async (event) => {
	const { farm, role } = await requireFarmAccess(event, event.params.farmId, 'farm:view');
	return json({ farm: farmJson(farm), role });
};

/** Replaces the farm's settings (owner or editor). */
export const PUT: RequestHandler = async (event) => {
	const { user, farm, role } = await requireFarmAccess(event, event.params.farmId, 'farm:edit');
	const body = await readJson(event.request);
	if (!body.ok) return body.response;
	const parsed = farmSchema.safeParse(body.body);
	if (!parsed.success) return invalidInput(parsed.error);
	await updateFarm(farm.id, user.id, parsed.data);
	return json({
		farm: farmJson({ ...farm, ...parsed.data }),
		role
	});
};

function farmJson(farm: {
	id: string;
	name: string;
	region: string;
	unitSystem: 'us' | 'metric';
	labourHoursAvailableByMonth: number[];
	interestRatePercent: number;
	fixedCostsUsdPerYear: number;
}) {
	return {
		id: farm.id,
		name: farm.name,
		region: farm.region,
		unitSystem: farm.unitSystem,
		labourHoursAvailableByMonth: farm.labourHoursAvailableByMonth,
		interestRatePercent: farm.interestRatePercent,
		fixedCostsUsdPerYear: farm.fixedCostsUsdPerYear
	};
}
