import type { FarmYearResult } from './farm-year';
import type { FieldYearResult } from './field-year';
import type { PlanResult } from './index';

/** A year's costs in the groups a whole-farm budget prints them, $. They sum to the year's costs. */
export interface CostGroups {
	/** Seed, fertiliser, chemicals, cover seed, custom hire, other direct costs and operating interest. */
	directUsd: number;
	/** Diesel and repairs of the field operations. */
	machineryUsd: number;
	/** Field work hours at the year's labour rate. */
	fieldLabourUsd: number;
	cashRentUsd: number;
	hayUsd: number;
	choreLabourUsd: number;
	/** Hired help's wages less its hours at the labour rate (the labour groups charge every hour at it). */
	hiredWageAdjustmentUsd: number;
	fixedUsd: number;
}

/** The whole farm's N ledger for a year, lb N: what the crops needed and where it came from. */
export interface FarmNitrogen {
	needLb: number;
	priorCropCreditLb: number;
	coverCreditLb: number;
	manureCreditLb: number;
	appliedLb: number;
	purchasedLb: number;
}

export interface FarmYearSummary extends FarmYearResult {
	costGroupsUsd: CostGroups;
	/** Field work alone by month (labour hours less chores). */
	fieldLabourHoursByMonth: number[];
	nitrogen: FarmNitrogen;
}

/** One field over the horizon: what it grows and what it returns each year. */
export interface FieldSummary {
	fieldId: string;
	fieldName: string;
	acres: number;
	rotationId: string;
	practiceIdByYear: string[];
	netReturnUsdByYear: number[];
}

/** What the plan editor shows as a plan is edited: farm-years, each field's returns and the partial budget. */
export interface PlanSummary extends Omit<PlanResult, 'fieldYears' | 'farmYears'> {
	detail: 'summary';
	farmYears: FarmYearSummary[];
	fields: FieldSummary[];
}

function farmYearSummary(farmYear: FarmYearResult, fieldYears: FieldYearResult[]): FarmYearSummary {
	const groups: CostGroups = {
		directUsd: 0,
		machineryUsd: 0,
		fieldLabourUsd: 0,
		cashRentUsd: farmYear.cashRentUsd,
		hayUsd: farmYear.hayCostUsd,
		choreLabourUsd: farmYear.choreLabourUsd,
		hiredWageAdjustmentUsd: farmYear.hiredWageAdjustmentUsd,
		fixedUsd: farmYear.fixedCostsUsd
	};
	const nitrogen: FarmNitrogen = {
		needLb: 0,
		priorCropCreditLb: 0,
		coverCreditLb: 0,
		manureCreditLb: 0,
		appliedLb: 0,
		purchasedLb: farmYear.nitrogenPurchasedLb
	};
	for (const fy of fieldYears) {
		groups.directUsd += fy.directCosts.totalUsd;
		groups.machineryUsd += fy.operationCosts.fuelUsd + fy.operationCosts.repairsUsd;
		groups.fieldLabourUsd += fy.operationCosts.labourUsd;
		nitrogen.needLb += fy.nitrogen.needLbPerAcre * fy.acres;
		nitrogen.priorCropCreditLb += fy.nitrogen.priorCropCreditLbPerAcre * fy.acres;
		nitrogen.coverCreditLb += fy.nitrogen.coverCreditLbPerAcre * fy.acres;
		nitrogen.manureCreditLb += fy.nitrogen.manureCreditLbPerAcre * fy.acres;
		nitrogen.appliedLb += fy.nitrogen.appliedLbPerAcre * fy.acres;
	}
	return {
		...farmYear,
		costGroupsUsd: groups,
		fieldLabourHoursByMonth: farmYear.labourHoursByMonth.map(
			(hours, m) => hours - farmYear.choreHoursByMonth[m]
		),
		nitrogen
	};
}

/**
 * The summary of an evaluated plan: every farm-year with its costs grouped, its field work by month and
 * its N ledger, and each field's net return by year, without the field-year detail (a 100-field,
 * 5-year plan's summary is a small fraction of its full result).
 */
export function summarisePlan(result: PlanResult): PlanSummary {
	const { fieldYears, farmYears, ...rest } = result;
	const byYear = new Map<number, FieldYearResult[]>(farmYears.map((fy) => [fy.year, []]));
	const byField = new Map<string, FieldSummary>();
	for (const fy of fieldYears) {
		byYear.get(fy.year)!.push(fy);
		let field = byField.get(fy.fieldId);
		if (!field) {
			field = {
				fieldId: fy.fieldId,
				fieldName: fy.fieldName,
				acres: fy.acres,
				rotationId: fy.rotationId,
				practiceIdByYear: [],
				netReturnUsdByYear: []
			};
			byField.set(fy.fieldId, field);
		}
		field.practiceIdByYear.push(fy.practiceId);
		field.netReturnUsdByYear.push(fy.netReturnUsd);
	}
	return {
		...rest,
		detail: 'summary',
		farmYears: farmYears.map((farmYear) => farmYearSummary(farmYear, byYear.get(farmYear.year)!)),
		fields: [...byField.values()]
	};
}
