import type { FieldIssue } from '../schemas/issues';
import type { PlanDocument } from '../schemas/plan-file';
import type { UnitSystem } from '../unit-systems';
import { adjustedPractice, adjustmentFor } from './adjustments';
import { evaluateFarmYear, type FarmYearResult } from './farm-year';
import {
	creditsForNextYear,
	evaluateFieldYear,
	shareOutGrazing,
	type CarriedCredits,
	type FieldYearResult
} from './field-year';
import { nonFiniteNumberPaths } from './finite';
import type { HiredHelp } from './labour';
import { partialBudget, yearItems, type PartialBudget, type YearItems } from './partial-budget';
import { yearPrices } from './prices';

export { creditsForNextYear } from './field-year';

export type { FarmYearResult } from './farm-year';
export type { FieldYearResult, NitrogenLedger, OperationResult } from './field-year';
export { summarisePlan } from './plan-summary';
export type {
	CostGroups,
	FarmNitrogen,
	FarmYearSummary,
	FieldSummary,
	PlanSummary
} from './plan-summary';
export type { BudgetLine, BudgetParts, PartialBudget, PartialBudgetYear } from './partial-budget';

export interface PlanResult {
	formatVersion: 2;
	plan: {
		name: string;
		farmName: string;
		region: string;
		unitSystem: UnitSystem;
		startYear: number;
		years: number;
		acres: number;
		fieldCount: number;
		assumptions: string[];
	};
	fieldYears: FieldYearResult[];
	farmYears: FarmYearResult[];
	partialBudget?: PartialBudget;
}

function planYears(plan: PlanDocument): number[] {
	const { startYear, years } = plan.plan.horizon;
	return Array.from({ length: years }, (_, i) => startYear + i);
}

/** The plan's parts by id, built once per evaluation. */
export interface PlanLookups {
	practiceById: Map<string, PlanDocument['practices'][number]>;
	operationsById: Map<string, PlanDocument['operations'][number]>;
	cropById: Map<string, PlanDocument['crops'][number]>;
	pricesByYear: Map<number, ReturnType<typeof yearPrices>>;
}

export function planLookups(plan: PlanDocument): PlanLookups {
	return {
		practiceById: new Map(plan.practices.map((p) => [p.id, p])),
		operationsById: new Map(plan.operations.map((o) => [o.id, o])),
		cropById: new Map(plan.crops.map((c) => [c.id, c])),
		pricesByYear: new Map(plan.priceSets.map((p) => [p.year, yearPrices(p)]))
	};
}

type Rotation = PlanDocument['rotations'][number];
type Field = PlanDocument['fields'][number];

/** The credits a field starts the plan with: its prior crop's, nothing from covers or manure yet. */
export function startingCredits(field: Field): CarriedCredits {
	return {
		priorCropCreditLbPerAcre: field.priorCropNitrogenCreditLbPerAcre,
		coverCreditLbPerAcre: 0,
		manureCreditLbPerAcre: 0
	};
}

/** One field's year `yearIndex` of the plan under `rotation`, started at `startingPhase` (1 = first). */
export function evaluateFieldInYear(
	plan: PlanDocument,
	lookups: PlanLookups,
	field: Field,
	rotation: Rotation,
	startingPhase: number,
	yearIndex: number,
	credits: CarriedCredits
) {
	const year = plan.plan.horizon.startYear + yearIndex;
	const phase = (startingPhase - 1 + yearIndex) % rotation.practices.length;
	const stated = lookups.practiceById.get(rotation.practices[phase])!;
	const adjustment = adjustmentFor(plan.plan.adjustments, field.id, stated.id);
	const practice = adjustedPractice(stated, adjustment);
	const result = evaluateFieldYear({
		field,
		year,
		rotationId: rotation.id,
		practice,
		nitrogenChangeLbPerAcre: adjustment.nitrogenChangeLbPerAcre,
		crop: lookups.cropById.get(practice.crop)!,
		prices: lookups.pricesByYear.get(year)!,
		herd: plan.herd,
		operationsById: lookups.operationsById,
		interestRatePercent: plan.farm.interestRatePercent,
		credits
	});
	return { result, practice };
}

/** The plan's hired people, as the budgets pay them. */
export function hiredHelpOf(plan: PlanDocument): HiredHelp[] {
	return plan.people
		.filter((person) => person.role === 'hired')
		.map((person) => ({
			wageUsdPerHour: person.wageUsdPerHour ?? 0,
			hoursAvailableByMonth: person.hoursAvailableByMonth
		}));
}

/** Every field-year and farm-year; with `budgeted`, also each year's items for a partial budget. */
function evaluateYears(plan: PlanDocument, budgeted: boolean) {
	const lookups = planLookups(plan);
	const rotationById = new Map(plan.rotations.map((r) => [r.id, r]));
	const assignmentByField = new Map(plan.plan.fieldRotations.map((a) => [a.fieldId, a]));
	const credits = new Map<string, CarriedCredits>(
		plan.fields.map((f) => [f.id, startingCredits(f)])
	);

	const fieldYears: FieldYearResult[] = [];
	const farmYears: FarmYearResult[] = [];
	const items: { year: number; items: YearItems }[] = [];
	const hiredHelp = hiredHelpOf(plan);
	for (const [i, year] of planYears(plan).entries()) {
		const prices = lookups.pricesByYear.get(year)!;
		const thisYear: FieldYearResult[] = [];
		const practices: PlanDocument['practices'] = [];
		for (const field of plan.fields) {
			const assignment = assignmentByField.get(field.id)!;
			const { result, practice } = evaluateFieldInYear(
				plan,
				lookups,
				field,
				rotationById.get(assignment.rotationId)!,
				assignment.startingPhase,
				i,
				credits.get(field.id)!
			);
			thisYear.push(result);
			practices.push(practice);
		}
		const farmYear = evaluateFarmYear(year, thisYear, plan.herd, prices, plan.farm, hiredHelp);
		// Credits follow what the herd ate, known only once the farm-year has fed it.
		const eatenShare = shareOutGrazing(thisYear, farmYear.grazingAuDays);
		thisYear.forEach((result, f) => {
			credits.set(result.fieldId, creditsForNextYear(practices[f], result, plan.herd, eatenShare));
		});
		fieldYears.push(...thisYear);
		farmYears.push(farmYear);
		if (budgeted) items.push({ year, items: yearItems(thisYear, farmYear) });
	}
	return { fieldYears, farmYears, items };
}

/** Years of the plan the reference plan does not cover: a partial budget needs both for every year. */
export function referenceHorizonIssues(plan: PlanDocument, reference: PlanDocument): FieldIssue[] {
	const referenceYears = new Set(planYears(reference));
	return planYears(plan)
		.filter((year) => !referenceYears.has(year))
		.map((year) => ({
			path: 'plan.horizon',
			message: `The reference plan "${reference.plan.name}" does not cover ${year}`
		}));
}

/** A result that would hold a number that is not finite: refused, naming where. */
export class NonFiniteResultError extends Error {
	constructor(readonly issues: FieldIssue[]) {
		super(issues.map((i) => `${i.path}: ${i.message}`).join('; '));
	}
}

/**
 * Evaluates a validated plan document: every field-year, every farm-year and, given a reference plan
 * covering the same years, the partial budget of the plan against it. Throws `NonFiniteResultError`
 * rather than answer a number that is not finite.
 */
export function evaluatePlan(plan: PlanDocument, reference?: PlanDocument): PlanResult {
	const { fieldYears, farmYears, items } = evaluateYears(plan, reference !== undefined);
	const acres = plan.fields.reduce((sum, f) => sum + f.acres, 0);
	const result: PlanResult = {
		formatVersion: 2,
		plan: {
			name: plan.plan.name,
			farmName: plan.farm.name,
			region: plan.farm.region,
			unitSystem: plan.farm.unitSystem,
			startYear: plan.plan.horizon.startYear,
			years: plan.plan.horizon.years,
			acres,
			fieldCount: plan.fields.length,
			assumptions: plan.plan.assumptions
		},
		fieldYears,
		farmYears
	};
	if (reference) {
		const mismatch = referenceHorizonIssues(plan, reference);
		if (mismatch.length) throw new Error(mismatch.map((m) => m.message).join('; '));
		const referenceItems = new Map(
			evaluateYears(reference, true).items.map((y) => [y.year, y.items])
		);
		result.partialBudget = partialBudget(reference.plan.name, acres, items, referenceItems);
	}
	const bad = nonFiniteNumberPaths(result);
	if (bad.length) {
		throw new NonFiniteResultError(
			bad.map((path) => ({
				path: `result.${path}`,
				message: 'The inputs give a number too large to work with: check the values it comes from.'
			}))
		);
	}
	return result;
}
