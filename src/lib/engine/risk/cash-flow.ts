import type { FarmYearResult } from '../farm-year';
import type { FieldYearResult } from '../field-year';
import type { PlanResult } from '../index';

/**
 * The monthly cash flow of an evaluated plan and the operating loan it needs. Every line of a year's
 * budget is paid or received in a month, so a line's months sum to the budget's figure; the budget's
 * operating interest (an estimate of what carrying the inputs costs) is replaced here by the interest the
 * operating loan accrues month by month, so it is not counted twice. The balance runs on from year to
 * year from the starting cash; the loan is drawn when the balance would fall below the minimum and repaid
 * as soon as cash comes in above it.
 */

/** What a cash-flow calculation needs beyond the plan's result. */
export interface CashFlowInput {
	/** Cash on hand at the start of the plan's first January, $. */
	startingCashUsd: number;
	/** The lowest balance the farm keeps; the loan is drawn to hold it, $. */
	minimumBalanceUsd: number;
	/** The farm's annual rate, charged on the loan balance each month (simple interest, rate ÷ 12). */
	interestRatePercent: number;
	/** Month (1–12) each crop is sold; a crop left out, or set before its harvest, is sold at harvest. */
	saleMonthByCrop: ReadonlyMap<string, number>;
	/** The herd's feeding season's first month, 1–12; null without a herd. */
	feedingSeasonStartMonth: number | null;
}

export type CashFlowLineKey =
	| 'crop-sales'
	| 'seed'
	| 'fertiliser'
	| 'chemicals'
	| 'other-direct'
	| 'custom-hire'
	| 'fuel'
	| 'repairs'
	| 'field-labour'
	| 'cash-rent'
	| 'hay'
	| 'chore-labour'
	| 'fixed-costs';

export interface CashFlowLine {
	key: CashFlowLineKey;
	label: string;
	direction: 'in' | 'out';
	/** January to December, $. */
	byMonthUsd: number[];
	/** The year's figure in the budget: the months sum to it. */
	totalUsd: number;
}

export interface CashFlowMonth {
	/** 1 = January. */
	month: number;
	openingBalanceUsd: number;
	moneyInUsd: number;
	/** Every budget line paid this month (the loan's interest is apart). */
	moneyOutUsd: number;
	/** Interest on the loan owed at the start of the month. */
	loanInterestUsd: number;
	loanDrawUsd: number;
	loanRepaymentUsd: number;
	/** Owed at the end of the month. */
	loanBalanceUsd: number;
	closingBalanceUsd: number;
}

export interface CashFlowYear {
	year: number;
	lines: CashFlowLine[];
	months: CashFlowMonth[];
	moneyInUsd: number;
	moneyOutUsd: number;
	loanInterestUsd: number;
	loanDrawnUsd: number;
	loanRepaidUsd: number;
	openingBalanceUsd: number;
	closingBalanceUsd: number;
	openingLoanUsd: number;
	closingLoanUsd: number;
	/** The most owed at the end of any month of the year, and the first month it was owed (null: none). */
	peakLoanUsd: number;
	peakLoanMonth: number | null;
	/** How the money out meets the budget: its costs less its operating-interest estimate. */
	budget: { revenueUsd: number; costsUsd: number; operatingInterestEstimateUsd: number };
}

export interface CashFlowSaleMonth {
	crop: string;
	cropName: string;
	/** The month set, or null: at harvest. */
	setMonth: number | null;
	/** Each year's harvest month and the month the crop is sold. */
	years: { year: number; harvestMonth: number; saleMonth: number }[];
}

export interface CashFlow {
	startingCashUsd: number;
	minimumBalanceUsd: number;
	interestRatePercent: number;
	years: CashFlowYear[];
	saleMonths: CashFlowSaleMonth[];
	/** The most owed at the end of any month of the horizon (0: never borrowed). */
	peakLoanUsd: number;
	peakLoan: { year: number; month: number } | null;
	loanInterestUsd: number;
}

// Common practice, no published source: a row crop's season starts in April and its harvest is in
// October in the Corn Belt, used only for a practice without field operations.
const defaultFirstMonth = 4;
const defaultHarvestMonth = 10;
// Common practice, no published source (recalled from Midwest cash leases): half the rent is due on
// 1 March and half on 1 November.
const rentMonths = [3, 11];

const lineLabels: Record<CashFlowLineKey, string> = {
	'crop-sales': 'Crop sales',
	seed: 'Seed and cover seed',
	fertiliser: 'Fertiliser',
	chemicals: 'Chemicals',
	'other-direct': 'Drying, hauling, insurance, other',
	'custom-hire': 'Custom hire',
	fuel: 'Diesel',
	repairs: 'Machinery repairs',
	'field-labour': 'Field labour',
	'cash-rent': 'Cash rent',
	hay: 'Purchased hay',
	'chore-labour': 'Chore labour',
	'fixed-costs': 'Fixed costs'
};
const lineKeys = Object.keys(lineLabels) as CashFlowLineKey[];

/** The months of a field-year's season: its first and last field operation (defaults without any). */
export function seasonMonths(fy: Pick<FieldYearResult, 'operations'>) {
	if (fy.operations.length === 0) {
		return { firstMonth: defaultFirstMonth, harvestMonth: defaultHarvestMonth };
	}
	const months = fy.operations.map((op) => op.month);
	return { firstMonth: Math.min(...months), harvestMonth: Math.max(...months) };
}

/** The month the crop is sold: the month set, unless that is before harvest (then at harvest). */
export function saleMonth(harvestMonth: number, setMonth: number | undefined): number {
	return setMonth !== undefined && setMonth >= harvestMonth ? setMonth : harvestMonth;
}

/** One year's lines: each budget line placed in its months. */
function yearLines(
	farmYear: FarmYearResult,
	fieldYears: FieldYearResult[],
	input: CashFlowInput,
	sold: (fy: FieldYearResult, harvestMonth: number) => number
): CashFlowLine[] {
	const months = new Map(lineKeys.map((key) => [key, new Array<number>(12).fill(0)]));
	const add = (key: CashFlowLineKey, month: number, usd: number) => {
		months.get(key)![month - 1] += usd;
	};
	for (const fy of fieldYears) {
		const { firstMonth, harvestMonth } = seasonMonths(fy);
		// Common practice, no published source: seed, fertiliser and chemicals are delivered and paid for
		// the month before the season's first field work (January when that is January); drying, hauling
		// and crop insurance are paid at harvest.
		const inputsMonth = Math.max(firstMonth - 1, 1);
		const d = fy.directCosts;
		add('seed', inputsMonth, d.seedUsd + d.coverSeedUsd);
		add('fertiliser', inputsMonth, d.nitrogenUsd + d.otherFertiliserUsd);
		add('chemicals', inputsMonth, d.chemicalsUsd);
		add('other-direct', harvestMonth, d.otherDirectUsd);
		// Operations are paid in the month they are done.
		for (const op of fy.operations) {
			add('custom-hire', op.month, op.customHireUsd);
			add('fuel', op.month, op.fuelUsd);
			add('repairs', op.month, op.repairsUsd);
			add('field-labour', op.month, op.labourUsd);
		}
		for (const month of rentMonths) add('cash-rent', month, fy.cashRentUsd / rentMonths.length);
		add('crop-sales', sold(fy, harvestMonth), fy.revenueUsd);
	}
	// Common practice, no published source: hay is bought the month before the feeding season starts.
	if (farmYear.hayCostUsd > 0) {
		const start = input.feedingSeasonStartMonth ?? 1;
		add('hay', start === 1 ? 12 : start - 1, farmYear.hayCostUsd);
	}
	// Chores are paid as they are done, month by month.
	if (farmYear.choreHours > 0) {
		farmYear.choreHoursByMonth.forEach((hours, m) =>
			add('chore-labour', m + 1, farmYear.choreLabourUsd * (hours / farmYear.choreHours))
		);
	}
	// Fixed costs (insurance, overhead, ownership) spread evenly over the year.
	for (let month = 1; month <= 12; month++) {
		add('fixed-costs', month, farmYear.fixedCostsUsd / 12);
	}

	return lineKeys.map((key) => {
		const byMonthUsd = months.get(key)!;
		return {
			key,
			label: lineLabels[key],
			direction: key === 'crop-sales' ? 'in' : 'out',
			byMonthUsd,
			totalUsd: byMonthUsd.reduce((sum, usd) => sum + usd, 0)
		};
	});
}

/** The loan's state between months. */
interface Position {
	balanceUsd: number;
	loanUsd: number;
}

/**
 * One month: interest on the loan owed at its start, then the month's money in and out; a balance below
 * the minimum draws the loan up to it, a balance above it repays the loan as far as it goes.
 */
export function loanMonth(
	position: Position,
	moneyInUsd: number,
	moneyOutUsd: number,
	input: Pick<CashFlowInput, 'interestRatePercent' | 'minimumBalanceUsd'>
): Omit<CashFlowMonth, 'month'> {
	const openingBalanceUsd = position.balanceUsd;
	const loanInterestUsd = position.loanUsd * (input.interestRatePercent / 100 / 12);
	let balance = openingBalanceUsd + moneyInUsd - moneyOutUsd - loanInterestUsd;
	let loan = position.loanUsd;
	let loanDrawUsd = 0;
	let loanRepaymentUsd = 0;
	if (balance < input.minimumBalanceUsd) {
		loanDrawUsd = input.minimumBalanceUsd - balance;
		loan += loanDrawUsd;
		balance = input.minimumBalanceUsd;
	} else if (loan > 0) {
		loanRepaymentUsd = Math.min(loan, balance - input.minimumBalanceUsd);
		loan -= loanRepaymentUsd;
		balance -= loanRepaymentUsd;
	}
	return {
		openingBalanceUsd,
		moneyInUsd,
		moneyOutUsd,
		loanInterestUsd,
		loanDrawUsd,
		loanRepaymentUsd,
		loanBalanceUsd: loan,
		closingBalanceUsd: balance
	};
}

const sum = (values: number[]) => values.reduce((total, v) => total + v, 0);

/**
 * The plan's monthly cash flow, year by year, with its operating loan: money in and out by line and
 * month, the running balance from the starting cash, the loan drawn, its interest and its repayment, and
 * the peak loan with its month.
 */
export function cashFlow(result: PlanResult, input: CashFlowInput): CashFlow {
	const fieldYearsByYear = new Map<number, FieldYearResult[]>(
		result.farmYears.map((fy) => [fy.year, []])
	);
	for (const fy of result.fieldYears) fieldYearsByYear.get(fy.year)?.push(fy);

	const saleMonthsByCrop = new Map<string, CashFlowSaleMonth>();
	const sold = (fy: FieldYearResult, harvestMonth: number) => {
		const setMonth = input.saleMonthByCrop.get(fy.crop);
		const month = saleMonth(harvestMonth, setMonth);
		let entry = saleMonthsByCrop.get(fy.crop);
		if (!entry) {
			entry = { crop: fy.crop, cropName: fy.cropName, setMonth: setMonth ?? null, years: [] };
			saleMonthsByCrop.set(fy.crop, entry);
		}
		// One line a year: a crop on several fields takes its latest harvest.
		const seen = entry.years.find((y) => y.year === fy.year);
		if (!seen) entry.years.push({ year: fy.year, harvestMonth, saleMonth: month });
		else if (harvestMonth > seen.harvestMonth)
			Object.assign(seen, { harvestMonth, saleMonth: month });
		return month;
	};

	let position: Position = { balanceUsd: input.startingCashUsd, loanUsd: 0 };
	let peakLoanUsd = 0;
	let peakLoan: CashFlow['peakLoan'] = null;
	const years = result.farmYears.map((farmYear): CashFlowYear => {
		const lines = yearLines(farmYear, fieldYearsByYear.get(farmYear.year)!, input, sold);
		const opening = position;
		const months: CashFlowMonth[] = [];
		let yearPeak = 0;
		let yearPeakMonth: number | null = null;
		for (let m = 0; m < 12; m++) {
			let moneyIn = 0;
			let moneyOut = 0;
			for (const line of lines) {
				if (line.direction === 'in') moneyIn += line.byMonthUsd[m];
				else moneyOut += line.byMonthUsd[m];
			}
			const month = { month: m + 1, ...loanMonth(position, moneyIn, moneyOut, input) };
			months.push(month);
			position = { balanceUsd: month.closingBalanceUsd, loanUsd: month.loanBalanceUsd };
			if (month.loanBalanceUsd > yearPeak) {
				yearPeak = month.loanBalanceUsd;
				yearPeakMonth = m + 1;
			}
		}
		if (yearPeak > peakLoanUsd) {
			peakLoanUsd = yearPeak;
			peakLoan = { year: farmYear.year, month: yearPeakMonth! };
		}
		const fieldYears = fieldYearsByYear.get(farmYear.year)!;
		return {
			year: farmYear.year,
			lines,
			months,
			moneyInUsd: sum(months.map((m) => m.moneyInUsd)),
			moneyOutUsd: sum(months.map((m) => m.moneyOutUsd)),
			loanInterestUsd: sum(months.map((m) => m.loanInterestUsd)),
			loanDrawnUsd: sum(months.map((m) => m.loanDrawUsd)),
			loanRepaidUsd: sum(months.map((m) => m.loanRepaymentUsd)),
			openingBalanceUsd: opening.balanceUsd,
			closingBalanceUsd: position.balanceUsd,
			openingLoanUsd: opening.loanUsd,
			closingLoanUsd: position.loanUsd,
			peakLoanUsd: yearPeak,
			peakLoanMonth: yearPeakMonth,
			budget: {
				revenueUsd: farmYear.revenueUsd,
				costsUsd: farmYear.costsUsd,
				operatingInterestEstimateUsd: sum(
					fieldYears.map((fy) => fy.directCosts.operatingInterestUsd)
				)
			}
		};
	});

	return {
		startingCashUsd: input.startingCashUsd,
		minimumBalanceUsd: input.minimumBalanceUsd,
		interestRatePercent: input.interestRatePercent,
		years,
		saleMonths: [...saleMonthsByCrop.values()],
		peakLoanUsd,
		peakLoan,
		loanInterestUsd: sum(years.map((y) => y.loanInterestUsd))
	};
}
