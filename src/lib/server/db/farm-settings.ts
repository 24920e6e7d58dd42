import type { FarmSettings } from '$lib/schemas/farm';
import type { farms } from './schema';

/** A farm row as its settings (the farm schema's shape) with its id: what forms and the API show. */
export function farmSettingsOf(farm: typeof farms.$inferSelect): FarmSettings & { id: string } {
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
