import { quantityUnits } from '$lib/engine/units';
import type { UnitSystem } from '$lib/unit-systems';
import type { ResultUnits } from './result-units';

/** The results' units in a farm's chosen system, from the one units module (server side: it loads mathjs). */
export function resultUnits(system: UnitSystem): ResultUnits {
	const unit = (quantity: 'mass' | 'volume' | 'area') => {
		const q = quantityUnits[quantity];
		return { unit: q[system], perUs: system === 'metric' ? q.metricPerUs : 1 };
	};
	return { mass: unit('mass'), volume: unit('volume'), area: unit('area') };
}
