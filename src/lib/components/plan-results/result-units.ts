/**
 * How the results show the quantities that differ between unit systems: the unit's name and how many
 * of it make one US unit. Plain data, so a page can take it from the server (`shownScales` in server/display-units.ts)
 * without loading the units library in the browser.
 */
export interface ResultUnit {
	unit: string;
	perUs: number;
}

export interface ResultUnits {
	/** lb or kg (N bought). */
	mass: ResultUnit;
	/** gal or L (diesel). */
	volume: ResultUnit;
	/** ac or ha (per-area returns). */
	area: ResultUnit;
}

/** The engine's own units: what the results show when no other system is asked for. */
export const usResultUnits: ResultUnits = {
	mass: { unit: 'lb', perUs: 1 },
	volume: { unit: 'gal', perUs: 1 },
	area: { unit: 'ac', perUs: 1 }
};

/** An amount in the shown unit (lb → kg). */
export function shownAmount(value: number, unit: ResultUnit): number {
	return value * unit.perUs;
}

/** An amount per US unit in the shown unit ($/ac → $/ha). */
export function shownPer(value: number, unit: ResultUnit): number {
	return value / unit.perUs;
}
