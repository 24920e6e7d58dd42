// The herd page's values in the order it shows them, each with its label and hint: the form and the
// read-only view a reviewer sees print the same words.
import type { Herd } from '$lib/schemas/plan-file';

export interface HerdInput {
	key: Exclude<keyof Herd, 'feedingSeasonStartMonth'>;
	label: string;
	/** Written after the value in the read-only view. */
	unit: string;
	hint: string;
	/** Whole numbers only (head, days). */
	integer?: boolean;
}

export const herdInputGroups: { legend: string; inputs: HerdInput[] }[] = [
	{
		legend: 'The herd',
		inputs: [
			{
				key: 'head',
				label: 'Head',
				unit: 'head',
				hint: 'Cows (with calves at side) the plan feeds, e.g. 60.',
				integer: true
			},
			{
				key: 'averageWeightLb',
				label: 'Average live weight (lb)',
				unit: 'lb',
				hint: 'A mature cow is often 1,100–1,400 lb; an animal unit is 1,000 lb.'
			},
			{
				key: 'intakeLbDmPerAuDay',
				label: 'Intake (lb dry matter per animal unit a day)',
				unit: 'lb DM per AU a day',
				hint: 'About 26 lb for a 1,000 lb cow (Society for Range Management).'
			}
		]
	},
	{
		legend: 'Feeding season',
		inputs: [
			{
				key: 'feedingSeasonDays',
				label: 'Feeding season (days)',
				unit: 'days',
				hint: 'Days the herd is off pasture and eats hay, covers or residue, e.g. 180.',
				integer: true
			},
			{
				key: 'maxGrazingDays',
				label: 'Most grazing days',
				unit: 'days',
				hint: 'Days grazing can last before snow or mud stops it; empty: the whole season.',
				integer: true
			}
		]
	},
	{
		legend: 'Hay',
		inputs: [
			{
				key: 'baleWeightLb',
				label: 'Bale weight (lb as fed)',
				unit: 'lb',
				hint: 'Weigh a few of your own; round bales run about 700–1,500 lb.'
			},
			{
				key: 'baleDryMatterPercent',
				label: 'Bale dry matter (%)',
				unit: '%',
				hint: 'Dry hay is about 85–90 %; baleage down to about 40 %.'
			},
			{
				key: 'feedingWastePercent',
				label: 'Feeding waste (%)',
				unit: '%',
				hint: 'Hay put out but not eaten: about 5 % with a cone feeder, up to 45 % with none.'
			}
		]
	},
	{
		legend: 'Chores',
		inputs: [
			{
				key: 'choreHoursPerDayFeedingHay',
				label: 'Chore hours a day feeding hay',
				unit: 'h a day',
				hint: 'Tractor, bales, water and checking, e.g. 1.5.'
			},
			{
				key: 'choreHoursPerDayGrazing',
				label: 'Chore hours a day grazing',
				unit: 'h a day',
				hint: 'Fence moves, water and checking, e.g. 0.75.'
			}
		]
	},
	{
		legend: 'Manure',
		inputs: [
			{
				key: 'manureNitrogenLbPerAuDay',
				label: 'Manure N (lb N per animal unit a day)',
				unit: 'lb N per AU a day',
				hint: 'About 0.42 lb for a beef cow (ASABE D384.2).'
			},
			{
				key: 'manureNitrogenAvailablePercent',
				label: 'Manure N available to the next crop (%)',
				unit: '%',
				hint: 'Share of grazing manure N the next crop can count on; 0 unless a soil test shows more.'
			}
		]
	}
];
