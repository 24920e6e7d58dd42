import type { PlanDocument, PriceSet } from '../../schemas/plan-file';
import { evaluatePlan } from '../index';

export {
	defaultSensitivitySteps,
	sensitivityStepSchema,
	sensitivityStepsSchema
} from '../../schemas/risk';

/**
 * One-at-a-time sensitivity: each input moved by each step while every other stays as planned, the plan
 * evaluated again in full (an economic-optimum N rate, residue grazing and the hay it saves all follow
 * the moved price or yield), and the change in the average net return over the horizon.
 */

export type SensitivityInput =
	| { kind: 'crop-price'; crop: string }
	| { kind: 'crop-yield'; crop: string }
	| { kind: 'nitrogen-price' }
	| { kind: 'diesel-price' }
	| { kind: 'hay-price' }
	| { kind: 'labour-rate' };

export interface SensitivityStep {
	stepPercent: number;
	averageNetReturnUsd: number;
	/** The step's average net return less the plan's. */
	changeUsd: number;
}

export interface SensitivityRow {
	/** `crop-price:corn`, `crop-yield:corn`, `nitrogen-price`, `diesel-price`, `hay-price`, `labour-rate`. */
	key: string;
	input: SensitivityInput;
	/** "Corn price", "Soybean yield", "N price"… */
	label: string;
	steps: SensitivityStep[];
	/** The largest change of any step, in size: the rows are sorted by it, largest first. */
	largestChangeUsd: number;
}

export interface Sensitivity {
	averageNetReturnUsd: number;
	stepsPercent: number[];
	rows: SensitivityRow[];
}

/** The plan's average net return a year over its horizon. */
export function averageNetReturnUsd(plan: PlanDocument): number {
	const { farmYears } = evaluatePlan(plan);
	return farmYears.reduce((sum, fy) => sum + fy.netReturnUsd, 0) / farmYears.length;
}

const scaled = (value: number, stepPercent: number) => value * (1 + stepPercent / 100);

/** Every price set with one price moved. */
function withPrices(plan: PlanDocument, change: (set: PriceSet) => PriceSet): PlanDocument {
	return { ...plan, priceSets: plan.priceSets.map(change) };
}

/** The plan with one input moved by `stepPercent` in every year. */
export function movedPlan(
	plan: PlanDocument,
	input: SensitivityInput,
	stepPercent: number
): PlanDocument {
	switch (input.kind) {
		case 'crop-price':
			return withPrices(plan, (set) => {
				const prices = new Map(Object.entries(set.cropPricesUsdPerUnit));
				const price = prices.get(input.crop);
				if (price === undefined) return set;
				return {
					...set,
					cropPricesUsdPerUnit: {
						...set.cropPricesUsdPerUnit,
						[input.crop]: scaled(price, stepPercent)
					}
				};
			});
		case 'crop-yield': {
			// Through the plan's own yield adjustments: one per practice of the crop, compounding with any
			// the plan already has, so the yield is the planned one × (1 + step).
			const added = plan.practices
				.filter((p) => p.crop === input.crop)
				.map((p) => ({
					practiceId: p.id,
					nitrogenChangeLbPerAcre: 0,
					yieldChangePercent: stepPercent
				}));
			return { ...plan, plan: { ...plan.plan, adjustments: [...plan.plan.adjustments, ...added] } };
		}
		case 'nitrogen-price':
			return withPrices(plan, (set) => ({
				...set,
				nitrogenUsdPerLb: scaled(set.nitrogenUsdPerLb, stepPercent)
			}));
		case 'diesel-price':
			return withPrices(plan, (set) => ({
				...set,
				dieselUsdPerGallon: scaled(set.dieselUsdPerGallon, stepPercent)
			}));
		case 'hay-price':
			return withPrices(plan, (set) => ({
				...set,
				hayUsdPerBale: scaled(set.hayUsdPerBale, stepPercent)
			}));
		case 'labour-rate':
			return withPrices(plan, (set) => ({
				...set,
				labourUsdPerHour: scaled(set.labourUsdPerHour, stepPercent)
			}));
	}
}

/** The crops the plan grows, in the order they first appear, with their names. */
function grownCrops(plan: PlanDocument): { id: string; name: string }[] {
	const practiceById = new Map(plan.practices.map((p) => [p.id, p]));
	const rotationById = new Map(plan.rotations.map((r) => [r.id, r]));
	const cropById = new Map(plan.crops.map((c) => [c.id, c]));
	const crops = new Map<string, string>();
	for (const assignment of plan.plan.fieldRotations) {
		for (const practiceId of rotationById.get(assignment.rotationId)?.practices ?? []) {
			const crop = cropById.get(practiceById.get(practiceId)?.crop ?? '');
			if (crop && !crops.has(crop.id)) crops.set(crop.id, crop.name);
		}
	}
	return [...crops].map(([id, name]) => ({ id, name }));
}

function inputs(plan: PlanDocument): { key: string; label: string; input: SensitivityInput }[] {
	const crops = grownCrops(plan);
	return [
		...crops.map((c) => ({
			key: `crop-price:${c.id}`,
			label: `${c.name} price`,
			input: { kind: 'crop-price' as const, crop: c.id }
		})),
		...crops.map((c) => ({
			key: `crop-yield:${c.id}`,
			label: `${c.name} yield`,
			input: { kind: 'crop-yield' as const, crop: c.id }
		})),
		{ key: 'nitrogen-price', label: 'N price', input: { kind: 'nitrogen-price' } },
		{ key: 'diesel-price', label: 'Diesel price', input: { kind: 'diesel-price' } },
		{ key: 'hay-price', label: 'Hay price', input: { kind: 'hay-price' } },
		{ key: 'labour-rate', label: 'Labour rate', input: { kind: 'labour-rate' } }
	];
}

/**
 * The change in the plan's average net return when each crop's price and yield, the N price, diesel,
 * hay price and labour rate move by each of `stepsPercent` (validate them with `sensitivityStepsSchema`),
 * one at a time, every year of the horizon. Rows are sorted by their largest change, largest first.
 * Throws the engine's `NonFiniteResultError` should a moved plan give a number that is not finite.
 */
export function sensitivity(plan: PlanDocument, stepsPercent: number[]): Sensitivity {
	const base = averageNetReturnUsd(plan);
	const rows = inputs(plan).map(({ key, label, input }) => {
		const steps = stepsPercent.map((stepPercent) => {
			const average = averageNetReturnUsd(movedPlan(plan, input, stepPercent));
			return { stepPercent, averageNetReturnUsd: average, changeUsd: average - base };
		});
		const largestChangeUsd = Math.max(0, ...steps.map((s) => Math.abs(s.changeUsd)));
		return { key, input, label, steps, largestChangeUsd };
	});
	rows.sort((a, b) => b.largestChangeUsd - a.largestChangeUsd);
	return { averageNetReturnUsd: base, stepsPercent, rows };
}
