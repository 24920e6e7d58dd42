// Break-even, one-at-a-time sensitivity and the monthly cash flow with its operating loan, checked by
// hand-worked arithmetic (shown beside each check) and by what must hold exactly: a month table that
// sums to the budget, a price moved by 10 % moving revenue by 10 %.
import { readdirSync, readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { evaluatePlan } from '../../src/lib/engine';
import { nonFiniteNumberPaths } from '../../src/lib/engine/finite';
import { breakEven } from '../../src/lib/engine/risk/break-even';
import { cashFlow, loanMonth, type CashFlowInput } from '../../src/lib/engine/risk/cash-flow';
import { movedPlan, sensitivity } from '../../src/lib/engine/risk/sensitivity';
import {
	parsePlanDocument,
	type PlanDocument,
	type PlanDocumentInput
} from '../../src/lib/schemas/plan-file';
import { cashFlowSettingsSchema, sensitivityQuerySchema } from '../../src/lib/schemas/risk';
import { oneCornFieldInput, smallPlanInput } from './fixtures';

function parsed(input: unknown): PlanDocument {
	const result = parsePlanDocument(input);
	if (!result.ok) throw new Error(JSON.stringify(result.issues));
	return result.plan;
}

const scenario = (name: string) =>
	parsed(JSON.parse(readFileSync(`scenarios/${name}.json`, 'utf8')));

/**
 * One 100-acre field of continuous corn, one year: 180 bu/ac at $4.40, no N bought, chemicals
 * $50/ac and a custom combine at $30/ac in October, no interest, no rent, no herd.
 */
function cornInput(): PlanDocumentInput {
	const input = oneCornFieldInput();
	input.plan.horizon.years = 1;
	input.priceSets = input.priceSets.slice(0, 1);
	input.operations = [{ id: 'combine', name: 'Combine (custom)', by: 'custom', month: 10 }];
	input.priceSets[0].customRatesUsdPerAcre = { combine: 30 };
	input.practices[0].chemicalsUsdPerAcre = 50;
	input.practices[0].operations = [{ operationId: 'combine' }];
	return input;
}

const settings = (over: Partial<CashFlowInput> = {}): CashFlowInput => ({
	startingCashUsd: 0,
	minimumBalanceUsd: 0,
	interestRatePercent: 0,
	saleMonthByCrop: new Map(),
	feedingSeasonStartMonth: null,
	...over
});

describe('break-even', () => {
	it('matches a hand-worked corn enterprise', () => {
		const input = cornInput();
		input.farm.fixedCostsUsdPerYear = 6000;
		const { years, horizon } = breakEven(evaluatePlan(parsed(input)));
		const [corn] = years[0].crops;
		// Hand-worked: costs = 100 ac × ($50 chemicals + $30 combine) = $8,000; production = 180 bu × 100 ac
		// = 18,000 bu; revenue = 18,000 × $4.40 = $79,200.
		expect(corn.costsUsd).toBeCloseTo(8000, 6);
		expect(corn.production).toBeCloseTo(18_000, 6);
		// Break-even price = $8,000 ÷ 18,000 bu = $0.4444/bu.
		expect(corn.breakEvenPriceUsdPerUnit).toBeCloseTo(8000 / 18_000, 9);
		// Break-even yield = $8,000 ÷ ($4.40 × 100 ac) = 18.1818 bu/ac.
		expect(corn.breakEvenYieldPerAcre).toBeCloseTo(8000 / 440, 9);
		// The farm adds $6,000 fixed costs: net = 79,200 − 8,000 − 6,000 = $65,200; the corn price that
		// zeroes it = 4.40 − 65,200 ÷ 18,000 = $0.7778/bu; the uniform price fall = 65,200 ÷ 79,200 = 82.32 %.
		expect(corn.farmBreakEvenPriceUsdPerUnit).toBeCloseTo(4.4 - 65_200 / 18_000, 9);
		expect(years[0].farm.netReturnUsd).toBeCloseTo(65_200, 6);
		expect(years[0].farm.priceFallPercent).toBeCloseTo((65_200 / 79_200) * 100, 9);
		// One year: the horizon is that year.
		expect(horizon.crops[0].breakEvenPriceUsdPerUnit).toBeCloseTo(8000 / 18_000, 9);
	});

	it('evaluates to a zero net return at the break-even price and yield', () => {
		const plan = parsed(cornInput());
		const [corn] = breakEven(evaluatePlan(plan)).years[0].crops;
		const atPrice = structuredClone(plan);
		atPrice.priceSets[0].cropPricesUsdPerUnit.corn = corn.breakEvenPriceUsdPerUnit!;
		expect(evaluatePlan(atPrice).farmYears[0].netReturnUsd).toBeCloseTo(0, 6);
		const atYield = structuredClone(plan);
		atYield.practices[0].yieldGoalPerAcre = corn.breakEvenYieldPerAcre!;
		expect(evaluatePlan(atYield).farmYears[0].netReturnUsd).toBeCloseTo(0, 6);
	});

	it('says why instead of answering Infinity: no yield, no price', () => {
		const noYield = cornInput();
		noYield.practices[0].yieldGoalPerAcre = 0;
		const [crop] = breakEven(evaluatePlan(parsed(noYield))).years[0].crops;
		expect(crop.breakEvenPriceUsdPerUnit).toBeNull();
		expect(crop.breakEvenPriceReason).toMatch(/no yield/i);
		expect(crop.farmBreakEvenPriceUsdPerUnit).toBeNull();

		const noPrice = cornInput();
		noPrice.priceSets[0].cropPricesUsdPerUnit = { corn: 0 };
		const result = breakEven(evaluatePlan(parsed(noPrice)));
		expect(result.years[0].crops[0].breakEvenYieldPerAcre).toBeNull();
		expect(result.years[0].crops[0].breakEvenYieldReason).toMatch(/no price/i);
		expect(result.years[0].farm.priceFallPercent).toBeNull();
		expect(result.years[0].farm.priceFallReason).toMatch(/no crop revenue/i);

		// A yield goal of the smallest number the schema lets through divides past any finite number.
		const tiny = cornInput();
		tiny.practices[0].yieldGoalPerAcre = Number.MIN_VALUE;
		const [tinyCrop] = breakEven(evaluatePlan(parsed(tiny))).years[0].crops;
		expect(tinyCrop.breakEvenPriceUsdPerUnit).toBeNull();
		expect(tinyCrop.breakEvenPriceReason).toMatch(/too large/i);
	});

	it('names a crop the farm can give away', () => {
		const input = cornInput();
		input.practices[0].chemicalsUsdPerAcre = 0;
		const plan = parsed(input);
		// Two crops: drop the custom rate so corn costs nothing; the farm's net return is all profit.
		plan.priceSets[0].customRatesUsdPerAcre = { combine: 0 };
		const [corn] = breakEven(evaluatePlan(plan)).years[0].crops;
		expect(corn.breakEvenPriceUsdPerUnit).toBe(0);
		expect(corn.farmBreakEvenPriceUsdPerUnit).toBeNull();
		expect(corn.farmBreakEvenPriceReason).toMatch(/even if this crop earns nothing/);
	});
});

/** The small test plan with a fixed N rate (150 lb/ac), so N does not follow the corn price. */
function fixedNitrogenPlan(herd = true): PlanDocument {
	const input = smallPlanInput();
	input.practices[0].nitrogen = { appliedLbPerAcre: 150 };
	if (!herd) input.herd = null;
	return parsed(input);
}

const average = (values: number[]) => values.reduce((s, v) => s + v, 0) / values.length;

describe('sensitivity', () => {
	const steps = [-20, -10, 10, 20];

	it('moves the net return by exactly the step × the crop revenue for a crop price', () => {
		const plan = fixedNitrogenPlan();
		const result = evaluatePlan(plan);
		const cornRevenueByYear = result.farmYears.map((fy) =>
			result.fieldYears
				.filter((f) => f.year === fy.year && f.crop === 'corn')
				.reduce((s, f) => s + f.revenueUsd, 0)
		);
		const found = sensitivity(plan, steps);
		const corn = found.rows.find((r) => r.key === 'crop-price:corn')!;
		// Closed form: revenue = price × production, every other figure held: Δ = step × corn revenue.
		for (const step of corn.steps) {
			expect(step.changeUsd).toBeCloseTo((step.stepPercent / 100) * average(cornRevenueByYear), 6);
		}
		expect(found.averageNetReturnUsd).toBeCloseTo(
			average(result.farmYears.map((fy) => fy.netReturnUsd)),
			6
		);
	});

	it('moves the net return by the step × the cost for N, diesel, hay and labour', () => {
		const plan = fixedNitrogenPlan();
		const { fieldYears, farmYears } = evaluatePlan(plan);
		const perYear = (pick: (f: (typeof fieldYears)[number]) => number) =>
			average(
				farmYears.map((fy) =>
					fieldYears.filter((f) => f.year === fy.year).reduce((s, f) => s + pick(f), 0)
				)
			);
		const nitrogen = perYear((f) => f.directCosts.nitrogenUsd);
		const diesel = perYear((f) => f.operationCosts.fuelUsd);
		const hay = average(farmYears.map((fy) => fy.hayCostUsd));
		const labour =
			perYear((f) => f.operationCosts.labourUsd) +
			average(farmYears.map((fy) => fy.choreLabourUsd));
		// Operating interest is charged on N and diesel for the months carried: 8 % × 6/12 = 4 % more.
		const interest = 1 + 0.08 * (6 / 12);
		const rows = new Map(sensitivity(plan, [10]).rows.map((r) => [r.key, r.steps[0].changeUsd]));
		expect(rows.get('nitrogen-price')).toBeCloseTo(-0.1 * nitrogen * interest, 6);
		expect(rows.get('diesel-price')).toBeCloseTo(-0.1 * diesel * interest, 6);
		expect(rows.get('hay-price')).toBeCloseTo(-0.1 * hay, 6);
		expect(rows.get('labour-rate')).toBeCloseTo(-0.1 * labour, 6);
		expect(hay).toBeGreaterThan(0);
	});

	it('moves yields through the plan’s yield adjustments: +10 % yield is +10 % revenue without a herd', () => {
		const plan = fixedNitrogenPlan(false);
		const result = evaluatePlan(plan);
		const soyRevenue = average(
			result.farmYears.map((fy) =>
				result.fieldYears
					.filter((f) => f.year === fy.year && f.crop === 'soybean')
					.reduce((s, f) => s + f.revenueUsd, 0)
			)
		);
		const moved = evaluatePlan(movedPlan(plan, { kind: 'crop-yield', crop: 'soybean' }, 10));
		const soy = moved.fieldYears.filter((f) => f.crop === 'soybean');
		const before = result.fieldYears.filter((f) => f.crop === 'soybean');
		soy.forEach((f, i) => expect(f.yieldPerAcre).toBeCloseTo(before[i].yieldPerAcre * 1.1, 9));
		const row = sensitivity(plan, [10]).rows.find((r) => r.key === 'crop-yield:soybean')!;
		expect(row.steps[0].changeUsd).toBeCloseTo(0.1 * soyRevenue, 6);
	});

	it('re-evaluates rather than scales: an economic-optimum N rate follows the corn price', () => {
		const plan = parsed(smallPlanInput());
		const moved = evaluatePlan(movedPlan(plan, { kind: 'crop-price', crop: 'corn' }, 20));
		const base = evaluatePlan(plan);
		const n = (r: typeof base) =>
			r.fieldYears.find((f) => f.crop === 'corn')!.nitrogen.appliedLbPerAcre;
		// A dearer bushel lowers the N:corn price ratio, so more N pays (ISU, Sawyer: MRTN by price ratio).
		expect(n(moved)).toBeGreaterThan(n(base));
	});

	it('sorts the rows by the size of their largest change', () => {
		const rows = sensitivity(fixedNitrogenPlan(), steps).rows;
		expect(rows.length).toBe(2 * 2 + 4);
		for (let i = 1; i < rows.length; i++) {
			expect(rows[i - 1].largestChangeUsd).toBeGreaterThanOrEqual(rows[i].largestChangeUsd);
		}
		expect(rows[0].largestChangeUsd).toBeGreaterThan(0);
	});

	it('reads the steps from the query and refuses what is out of range, in the message helpers’ words', () => {
		expect(sensitivityQuerySchema.parse({}).steps).toEqual([-20, -10, 10, 20]);
		expect(sensitivityQuerySchema.parse({ steps: '-5, 5,15' }).steps).toEqual([-5, 5, 15]);
		const messages = (steps: string) => {
			const result = sensitivityQuerySchema.safeParse({ steps });
			return result.success ? [] : result.error.issues.map((i) => i.message);
		};
		expect(messages('-95,10')).toContain('A sensitivity step must be at least -90 %.');
		expect(messages('10,150')).toContain('A sensitivity step must be at most 100 %.');
		expect(messages('0')).toContain('A sensitivity step of 0 % moves nothing: leave it out.');
		expect(messages('ten')).toContain('Enter a sensitivity step as a number.');
		expect(messages('10,10')).toContain('Give each sensitivity step once.');
		expect(messages('1,2,3,4,5,6,7,8,9')).toContain('Give at most 8 sensitivity steps.');
	});
});

describe('cash flow', () => {
	const names = readdirSync('scenarios').map((f) => f.replace(/\.json$/, ''));

	it.each(names)('sums each line’s months to the budget of every year (%s)', (name) => {
		const plan = scenario(name);
		const result = evaluatePlan(plan);
		const flow = cashFlow(result, {
			startingCashUsd: 50_000,
			minimumBalanceUsd: 10_000,
			interestRatePercent: plan.farm.interestRatePercent,
			// Corn stored and sold in December; soybean at harvest.
			saleMonthByCrop: new Map([['corn', 12]]),
			feedingSeasonStartMonth: plan.herd?.feedingSeasonStartMonth ?? null
		});
		expect(flow.years.map((y) => y.year)).toEqual(result.farmYears.map((fy) => fy.year));
		for (const [i, year] of flow.years.entries()) {
			const farmYear = result.farmYears[i];
			const fieldYears = result.fieldYears.filter((f) => f.year === year.year);
			const total = (pick: (f: (typeof fieldYears)[number]) => number) =>
				fieldYears.reduce((s, f) => s + pick(f), 0);
			const line = (key: string) => year.lines.find((l) => l.key === key)!;
			const months = (key: string) => line(key).byMonthUsd.reduce((s, v) => s + v, 0);
			const close = (a: number, b: number) => expect(a).toBeCloseTo(b, 4);
			close(months('crop-sales'), farmYear.revenueUsd);
			close(
				months('seed'),
				total((f) => f.directCosts.seedUsd + f.directCosts.coverSeedUsd)
			);
			close(
				months('fertiliser'),
				total((f) => f.directCosts.nitrogenUsd + f.directCosts.otherFertiliserUsd)
			);
			close(
				months('fuel'),
				total((f) => f.operationCosts.fuelUsd)
			);
			close(
				months('field-labour'),
				total((f) => f.operationCosts.labourUsd)
			);
			close(months('cash-rent'), farmYear.cashRentUsd);
			close(months('hay'), farmYear.hayCostUsd);
			close(months('chore-labour'), farmYear.choreLabourUsd);
			close(months('fixed-costs'), farmYear.fixedCostsUsd);
			// Money in is the budget's revenue; money out its costs less the operating-interest estimate,
			// which the loan's own interest replaces.
			close(year.moneyInUsd, farmYear.revenueUsd);
			close(year.moneyOutUsd, farmYear.costsUsd - total((f) => f.directCosts.operatingInterestUsd));
			close(year.budget.costsUsd - year.budget.operatingInterestEstimateUsd, year.moneyOutUsd);
			// The balance moves by what came in and went out, interest, and the loan drawn less repaid.
			close(
				year.closingBalanceUsd - year.openingBalanceUsd,
				year.moneyInUsd -
					year.moneyOutUsd -
					year.loanInterestUsd +
					year.loanDrawnUsd -
					year.loanRepaidUsd
			);
			for (const month of year.months) {
				expect(month.closingBalanceUsd).toBeGreaterThanOrEqual(10_000 - 1e-6);
			}
		}
		expect(flow.years.find((y) => y.lines[0].byMonthUsd[11] > 0)).toBeDefined();
		expect(flow.peakLoanUsd).toBe(Math.max(...flow.years.map((y) => y.peakLoanUsd)));
	});

	it('draws, charges interest on and repays the loan as hand-worked', () => {
		const rate = { interestRatePercent: 12, minimumBalanceUsd: 5000 };
		// $10,000 on hand, $20,000 out: −$10,000, so $15,000 is drawn to hold the $5,000 minimum.
		const a = loanMonth({ balanceUsd: 10_000, loanUsd: 0 }, 0, 20_000, rate);
		expect(a).toMatchObject({
			loanDrawUsd: 15_000,
			loanBalanceUsd: 15_000,
			closingBalanceUsd: 5000
		});
		// Next month: 1 % of $15,000 = $150 interest, paid by drawing $150 more.
		const b = loanMonth({ balanceUsd: 5000, loanUsd: 15_000 }, 0, 0, rate);
		expect(b.loanInterestUsd).toBeCloseTo(150, 9);
		expect(b.loanBalanceUsd).toBeCloseTo(15_150, 9);
		// $30,000 comes in: interest 1 % of $15,150 = $151.50; 5,000 + 30,000 − 151.50 = $34,848.50, of which
		// $15,150 repays the loan: $19,698.50 left.
		const c = loanMonth({ balanceUsd: 5000, loanUsd: 15_150 }, 30_000, 0, rate);
		expect(c.loanInterestUsd).toBeCloseTo(151.5, 9);
		expect(c.loanRepaymentUsd).toBeCloseTo(15_150, 9);
		expect(c.loanBalanceUsd).toBe(0);
		expect(c.closingBalanceUsd).toBeCloseTo(19_698.5, 9);
	});

	it('finds the peak loan and its month over a hand-worked season', () => {
		// The corn field without field operations: chemicals $5,000, 18,000 bu × $4.40 = $79,200 of corn.
		const input = cornInput();
		input.practices[0].operations = [];
		const result = evaluatePlan(parsed(input));
		const flow = cashFlow(result, settings({ interestRatePercent: 12 }));
		const [year] = flow.years;
		// No operations: the season's default first month is April, so chemicals are paid in March.
		expect(year.lines.find((l) => l.key === 'chemicals')!.byMonthUsd[2]).toBeCloseTo(5000, 9);
		// Hand-worked at 1 % a month: $5,000 drawn in March; interest drawn each month after, the loan
		// grows × 1.01: Apr 5,050; May 5,100.50; Jun 5,151.505; Jul 5,203.02; Aug 5,255.05; Sep 5,307.60.
		expect(flow.peakLoanUsd).toBeCloseTo(5000 * 1.01 ** 6, 6);
		expect(flow.peakLoan).toEqual({ year: 2027, month: 9 });
		// October: $53.08 interest, then the sale repays it all. Interest paid April to October =
		// 5,000 × (1.01⁷ − 1) = $360.68; the year closes with 79,200 − 5,000 − 360.68 = $73,839.32.
		expect(year.loanInterestUsd).toBeCloseTo(5000 * (1.01 ** 7 - 1), 6);
		expect(year.closingLoanUsd).toBe(0);
		expect(year.closingBalanceUsd).toBeCloseTo(79_200 - 5000 - 5000 * (1.01 ** 7 - 1), 6);
		// Stored and sold in December instead: the loan runs two months longer and peaks in November.
		const stored = cashFlow(
			result,
			settings({ interestRatePercent: 12, saleMonthByCrop: new Map([['corn', 12]]) })
		);
		expect(stored.peakLoan).toEqual({ year: 2027, month: 11 });
		expect(stored.peakLoanUsd).toBeCloseTo(5000 * 1.01 ** 8, 6);
		// A sale month set before harvest sells at harvest.
		const early = cashFlow(result, settings({ saleMonthByCrop: new Map([['corn', 2]]) }));
		expect(early.saleMonths[0].years[0]).toEqual({ year: 2027, harvestMonth: 10, saleMonth: 10 });
	});

	it('borrows nothing when the starting cash carries the season', () => {
		const result = evaluatePlan(parsed(cornInput()));
		const flow = cashFlow(result, settings({ startingCashUsd: 10_000, interestRatePercent: 12 }));
		expect(flow.peakLoanUsd).toBe(0);
		expect(flow.peakLoan).toBeNull();
		expect(flow.loanInterestUsd).toBe(0);
	});

	it('validates the settings with ranges in the message helpers’ words', () => {
		const issues = cashFlowSettingsSchema.safeParse({
			startingCashUsd: -1,
			minimumBalanceUsd: 200_000_000,
			saleMonths: [
				{ crop: 'corn', month: 13 },
				{ crop: 'corn', month: 11 }
			]
		});
		expect(issues.success).toBe(false);
		const messages = issues.error!.issues.map((i) => i.message);
		expect(messages).toContain('The starting cash must be at least $0.');
		expect(messages).toContain('The minimum balance must be at most $100,000,000.');
		expect(messages).toContain('The sale month must be a month from 1 (January) to 12 (December).');
	});
});

describe('extreme inputs the schemas accept', () => {
	it('give finite numbers everywhere', () => {
		const input = smallPlanInput();
		input.fields = [
			{ id: 'east', name: 'East', acres: 20_000, productivityIndex: 3 },
			{ id: 'west', name: 'West', acres: 0.01, productivityIndex: 0.1 }
		];
		input.farm.interestRatePercent = 50;
		input.farm.fixedCostsUsdPerYear = 100_000_000;
		input.practices[0].yieldGoalPerAcre = 500;
		for (const set of input.priceSets) {
			set.cropPricesUsdPerUnit = { corn: 0.01, soybean: 0 };
			set.nitrogenUsdPerLb = 20;
			set.hayUsdPerBale = 2000;
			set.labourUsdPerHour = 500;
			set.dieselUsdPerGallon = 50;
		}
		const plan = parsed(input);
		const result = evaluatePlan(plan);
		expect(nonFiniteNumberPaths(breakEven(result))).toEqual([]);
		expect(nonFiniteNumberPaths(sensitivity(plan, [-90, 100]))).toEqual([]);
		const flow = cashFlow(
			result,
			settings({
				startingCashUsd: 100_000_000,
				minimumBalanceUsd: 100_000_000,
				interestRatePercent: 50,
				saleMonthByCrop: new Map([['corn', 12]])
			})
		);
		expect(nonFiniteNumberPaths(flow)).toEqual([]);
		expect(flow.peakLoanUsd).toBeGreaterThan(0);
	});
});
