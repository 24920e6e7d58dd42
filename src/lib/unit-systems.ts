/** The unit systems a farm can choose to see its numbers in; values are stored in US customary. */
export const unitSystems = ['us', 'metric'] as const;
export type UnitSystem = (typeof unitSystems)[number];

export const unitSystemLabels: Record<UnitSystem, string> = {
	us: 'US customary (acres, bu, lb)',
	metric: 'Metric (ha, t, kg)'
};
