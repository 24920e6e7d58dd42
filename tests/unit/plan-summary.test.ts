// summarisePlan: the plan editor's summary of an evaluated plan. Its figures are the evaluation's
// regrouped, so each check is a budget identity (parts sum to the whole; common practice, no published
// source) taken against the full result's own numbers, plus the size the issue asks of the answer.
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import {
	evaluatePlan,
	summarisePlan,
	type FarmYearSummary,
	type FieldYearResult,
	type PlanResult,
	type PlanSummary
} from '../../src/lib/engine';
import {
	parsePlanDocument,
	type PlanDocument,
	type PlanDocumentInput
} from '../../src/lib/schemas/plan-file';
import { smallPlanInput } from './fixtures';

function parse(input: unknown): PlanDocument {
	const result = parsePlanDocument(input);
	if (!result.ok) throw new Error(JSON.stringify(result.issues));
	return result.plan;
}

const scenario = (name: string): PlanDocumentInput =>
	JSON.parse(readFileSync(`scenarios/${name}.json`, 'utf8'));
const scenarioNames = ['reference', 'reduced-n', 'small-grain-peas', 'wide-row-interseeded'];

// The scenarios have cash-rented fields, covers, grazing and N credits; the fixture has custom hire.
const plans: [string, PlanResult][] = [
	...scenarioNames.map((name): [string, PlanResult] => [
		`scenarios/${name}.json`,
		evaluatePlan(parse(scenario(name)))
	]),
	['the small test plan', evaluatePlan(parse(smallPlanInput()))]
];

// The engine's type leaves `farmYears` as the full result's; the summary's farm-years carry more.
type Summary = Omit<PlanSummary, 'farmYears'> & { farmYears: FarmYearSummary[] };

const sum = (values: number[]) => values.reduce((total, value) => total + value, 0);
const fieldYearsOf = (result: PlanResult, year: number) =>
	result.fieldYears.filter((fy) => fy.year === year);

describe.each(plans)('the summary of %s', (_name, result) => {
	const summary = summarisePlan(result) as Summary;

	it('keeps every farm-year and leaves the field-years out', () => {
		expect(summary.detail).toBe('summary');
		expect(summary).not.toHaveProperty('fieldYears');
		expect(summary.farmYears).toHaveLength(result.plan.years);
		summary.farmYears.forEach((farmYear, i) => expect(farmYear).toMatchObject(result.farmYears[i]));
	});

	it("groups each year's costs into parts that sum to the year's costs", () => {
		for (const farmYear of summary.farmYears) {
			const groups = farmYear.costGroupsUsd;
			expect(sum(Object.values(groups))).toBeCloseTo(farmYear.costsUsd, 6);
			// Every group is a cost, and the field's own groups are its field costs.
			for (const amount of Object.values(groups)) expect(amount).toBeGreaterThanOrEqual(0);
			expect(
				groups.directUsd + groups.machineryUsd + groups.fieldLabourUsd + groups.cashRentUsd
			).toBeCloseTo(farmYear.fieldCostsUsd, 6);
			const own = fieldYearsOf(result, farmYear.year);
			expect(groups.cashRentUsd).toBeCloseTo(sum(own.map((fy) => fy.cashRentUsd)), 6);
		}
	});

	it('gives field work by month that with the chores makes the labour hours by month', () => {
		for (const farmYear of summary.farmYears) {
			expect(farmYear.fieldLabourHoursByMonth).toHaveLength(12);
			farmYear.fieldLabourHoursByMonth.forEach((hours, m) => {
				expect(hours + farmYear.choreHoursByMonth[m]).toBeCloseTo(
					farmYear.labourHoursByMonth[m],
					9
				);
				expect(hours).toBeGreaterThanOrEqual(-1e-9);
			});
			// Field work over the year is the field-years' own labour hours.
			const own = fieldYearsOf(result, farmYear.year);
			expect(sum(farmYear.fieldLabourHoursByMonth)).toBeCloseTo(
				sum(own.map((fy) => fy.labourHours)),
				6
			);
		}
	});

	it("sums the farm's N ledger from the field-years' lb N per acre times their acres", () => {
		const farmLb = (own: FieldYearResult[], perAcre: (fy: FieldYearResult) => number) =>
			sum(own.map((fy) => perAcre(fy) * fy.acres));
		for (const farmYear of summary.farmYears) {
			const own = fieldYearsOf(result, farmYear.year);
			const { nitrogen } = farmYear;
			expect(nitrogen.needLb).toBeCloseTo(
				farmLb(own, (fy) => fy.nitrogen.needLbPerAcre),
				6
			);
			expect(nitrogen.priorCropCreditLb).toBeCloseTo(
				farmLb(own, (fy) => fy.nitrogen.priorCropCreditLbPerAcre),
				6
			);
			expect(nitrogen.coverCreditLb).toBeCloseTo(
				farmLb(own, (fy) => fy.nitrogen.coverCreditLbPerAcre),
				6
			);
			expect(nitrogen.manureCreditLb).toBeCloseTo(
				farmLb(own, (fy) => fy.nitrogen.manureCreditLbPerAcre),
				6
			);
			expect(nitrogen.appliedLb).toBeCloseTo(
				farmLb(own, (fy) => fy.nitrogen.appliedLbPerAcre),
				6
			);
			// N bought is N applied: the year's purchase, and each field's.
			expect(nitrogen.purchasedLb).toBeCloseTo(sum(own.map((fy) => fy.nitrogen.purchasedLb)), 6);
			expect(nitrogen.purchasedLb).toBeCloseTo(nitrogen.appliedLb, 6);
		}
	});

	it("gives each field its field-years' net return, year by year, and its acres and rotation", () => {
		const fieldIds = new Set(result.fieldYears.map((fy) => fy.fieldId));
		expect(summary.fields.map((f) => f.fieldId).sort()).toEqual([...fieldIds].sort());
		for (const field of summary.fields) {
			const own = result.fieldYears
				.filter((fy) => fy.fieldId === field.fieldId)
				.sort((a, b) => a.year - b.year);
			expect(field.netReturnUsdByYear).toEqual(own.map((fy) => fy.netReturnUsd));
			expect(field.practiceIdByYear).toEqual(own.map((fy) => fy.practiceId));
			expect(field).toMatchObject({ acres: own[0].acres, rotationId: own[0].rotationId });
		}
		// The fields' returns add up to the field part of each year's net return.
		summary.farmYears.forEach((farmYear, i) => {
			const fields = sum(summary.fields.map((f) => f.netReturnUsdByYear[i]));
			expect(fields).toBeCloseTo(farmYear.revenueUsd - farmYear.fieldCostsUsd, 6);
		});
	});
});

describe('the summary with a partial budget', () => {
	it('keeps the partial budget as the evaluation gives it', () => {
		const result = evaluatePlan(parse(scenario('reduced-n')), parse(scenario('reference')));
		expect(result.partialBudget).toBeDefined();
		expect(summarisePlan(result).partialBudget).toEqual(result.partialBudget);
	});
});

/**
 * A 100-field, 5-year plan the way `npm run bench` builds one: the demo farm's practices and rotations
 * on 100 generated fields (sizes from a fixed sequence), each field on one of the rotations in turn.
 */
function hundredFieldPlan(): PlanDocumentInput {
	const scenarios = scenarioNames.map(scenario);
	const doc = structuredClone(scenario('small-grain-peas'));
	const byId = <T extends { id: string }>(lists: T[][]) => [
		...new Map(lists.flat().map((item) => [item.id, item])).values()
	];
	doc.practices = byId(scenarios.map((s) => s.practices));
	doc.rotations = byId(scenarios.map((s) => s.rotations));
	doc.fields = [];
	doc.plan.fieldRotations = [];
	for (let i = 0; i < 100; i++) {
		const id = `field-${i + 1}`;
		const rotation = doc.rotations[i % doc.rotations.length];
		doc.fields.push({
			id,
			name: `Field ${i + 1}`,
			acres: 10 + ((i * 37) % 71),
			productivityIndex: 0.85 + ((i * 13) % 31) / 100
		});
		doc.plan.fieldRotations.push({
			fieldId: id,
			rotationId: rotation.id,
			startingPhase: 1 + (i % rotation.practices.length)
		});
	}
	return doc;
}

describe('the size of the summary', () => {
	it("of a 100-field, 5-year plan is under 100 KB (the issue's target), a fraction of the full result", () => {
		const result = evaluatePlan(parse(hundredFieldPlan()));
		expect(result.plan).toMatchObject({ fieldCount: 100, years: 5 });
		const summaryChars = JSON.stringify(summarisePlan(result)).length;
		const fullChars = JSON.stringify(result).length;
		expect(summaryChars).toBeLessThan(100 * 1024);
		expect(summaryChars).toBeLessThan(fullChars / 4);
	});
});
