import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { evaluatePlan } from '../../src/lib/engine';
import { parsePlanDocument, type PlanDocument } from '../../src/lib/schemas/plan-file';
import { smallPlanInput } from './fixtures';

/** Random variations of the small plan: sizes, yields, prices, rates, herd and grazing. */
const planArbitrary = fc
	.record({
		eastAcres: fc.double({ min: 1, max: 2000, noNaN: true }),
		westAcres: fc.double({ min: 1, max: 2000, noNaN: true }),
		productivityIndex: fc.double({ min: 0.5, max: 1.5, noNaN: true }),
		cornGoal: fc.double({ min: 50, max: 300, noNaN: true }),
		cornN: fc.oneof(
			fc.constant('economic-optimum' as const),
			fc.double({ min: 0, max: 250, noNaN: true })
		),
		cornPrice: fc.double({ min: 2, max: 8, noNaN: true }),
		nitrogenPrice: fc.double({ min: 0.2, max: 1.2, noNaN: true }),
		head: fc.integer({ min: 0, max: 400 }),
		legumeShare: fc.double({ min: 0, max: 100, noNaN: true }),
		grazingUtilisation: fc.double({ min: 0, max: 80, noNaN: true }),
		manureAvailable: fc.double({ min: 0, max: 60, noNaN: true }),
		priorCredit: fc.double({ min: 0, max: 60, noNaN: true }),
		startingPhase: fc.integer({ min: 1, max: 2 })
	})
	.map((v) => {
		const input = smallPlanInput();
		input.fields[0].acres = v.eastAcres;
		input.fields[1].acres = v.westAcres;
		input.fields[1].productivityIndex = v.productivityIndex;
		input.fields[0].priorCropNitrogenCreditLbPerAcre = v.priorCredit;
		input.practices[0].yieldGoalPerAcre = v.cornGoal;
		input.practices[0].nitrogen!.appliedLbPerAcre = v.cornN;
		input.practices[1].coverMix!.legumeSharePercent = v.legumeShare;
		input.practices[1].coverMix!.grazingUtilisationPercent = v.grazingUtilisation;
		input.herd!.head = v.head;
		input.herd!.manureNitrogenAvailablePercent = v.manureAvailable;
		input.plan.fieldRotations[0].startingPhase = v.startingPhase;
		for (const set of input.priceSets) {
			set.cropPricesUsdPerUnit.corn = v.cornPrice;
			set.nitrogenUsdPerLb = v.nitrogenPrice;
		}
		const parsed = parsePlanDocument(input);
		if (!parsed.ok) throw new Error(JSON.stringify(parsed.issues));
		return parsed.plan;
	});

/** The whole farm twice over: every field and the herd. (Doubling fields alone would leave the same
 * herd eating a smaller share of what they offer, and credits follow what is eaten.) */
function withFarmDoubled(plan: PlanDocument): PlanDocument {
	return {
		...plan,
		fields: plan.fields.map((f) => ({ ...f, acres: f.acres * 2 })),
		herd: plan.herd && { ...plan.herd, head: plan.herd.head * 2 }
	};
}

const relative = (a: number, b: number) =>
	Math.abs(a - b) <= 1e-9 * Math.max(1, Math.abs(a), Math.abs(b));

describe('invariants', () => {
	it('a plan against itself has a zero partial budget', () => {
		fc.assert(
			fc.property(planArbitrary, (plan) => {
				const budget = evaluatePlan(plan, plan).partialBudget!;
				for (const part of [...budget.years, budget.average]) {
					expect(
						part.addedReturnsUsd +
							part.reducedCostsUsd +
							part.addedCostsUsd +
							part.reducedReturnsUsd
					).toBe(0);
					expect(part.netChangeUsd).toBe(0);
					expect(Object.values(part.lines).flat()).toEqual([]);
				}
			})
		);
	});

	it('doubling every field and the herd doubles revenue, direct costs, diesel, N bought, labour and hay', () => {
		fc.assert(
			fc.property(planArbitrary, (plan) => {
				const once = evaluatePlan(plan);
				const twice = evaluatePlan(withFarmDoubled(plan));
				once.farmYears.forEach((a, i) => {
					const b = twice.farmYears[i];
					expect(relative(b.revenueUsd, 2 * a.revenueUsd)).toBe(true);
					expect(relative(b.dieselGallons, 2 * a.dieselGallons)).toBe(true);
					expect(relative(b.nitrogenPurchasedLb, 2 * a.nitrogenPurchasedLb)).toBe(true);
					expect(relative(b.fieldLabourHours, 2 * a.fieldLabourHours)).toBe(true);
					expect(relative(b.hayBales, 2 * a.hayBales)).toBe(true);
				});
				once.fieldYears.forEach((a, i) => {
					const b = twice.fieldYears[i];
					expect(relative(b.directCosts.totalUsd, 2 * a.directCosts.totalUsd)).toBe(true);
					expect(relative(b.forage.grazingAuDays, 2 * a.forage.grazingAuDays)).toBe(true);
				});
			})
		);
	});

	it('a partial budget nets to the change in net return, crop switches included', () => {
		fc.assert(
			fc.property(planArbitrary, planArbitrary, (plan, reference) => {
				const result = evaluatePlan(plan, reference);
				const referenceYears = evaluatePlan(reference).farmYears;
				const budget = result.partialBudget!;
				budget.years.forEach((year, i) => {
					const change = result.farmYears[i].netReturnUsd - referenceYears[i].netReturnUsd;
					// Lines under a hundredth of a cent are left out, so within a cent overall
					expect(Math.abs(year.netChangeUsd - change)).toBeLessThan(0.01);
					const sumOf = (lines: { amountUsd: number }[]) =>
						lines.reduce((s, l) => s + l.amountUsd, 0);
					expect(year.addedCostsUsd).toBeCloseTo(sumOf(year.lines.addedCosts), 6);
					for (const line of Object.values(year.lines).flat()) {
						expect(line.amountUsd).toBeGreaterThan(0);
					}
				});
			})
		);
	});

	it('farm-year totals equal the sum of their field-years', () => {
		fc.assert(
			fc.property(planArbitrary, (plan) => {
				const result = evaluatePlan(plan);
				for (const farmYear of result.farmYears) {
					const fys = result.fieldYears.filter((f) => f.year === farmYear.year);
					const sum = (pick: (f: (typeof fys)[number]) => number) =>
						fys.reduce((s, f) => s + pick(f), 0);
					expect(farmYear.revenueUsd).toBeCloseTo(
						sum((f) => f.revenueUsd),
						6
					);
					expect(farmYear.fieldCostsUsd).toBeCloseTo(
						sum((f) => f.costsUsd),
						6
					);
					expect(farmYear.dieselGallons).toBeCloseTo(
						sum((f) => f.dieselGallons),
						9
					);
					expect(farmYear.nitrogenPurchasedLb).toBeCloseTo(
						sum((f) => f.nitrogen.purchasedLb),
						6
					);
					expect(farmYear.fieldLabourHours).toBeCloseTo(
						sum((f) => f.labourHours),
						9
					);
					expect(farmYear.grazingAuDaysOffered).toBeCloseTo(
						sum((f) => f.forage.grazingAuDays),
						6
					);
					expect(farmYear.acres).toBeCloseTo(
						sum((f) => f.acres),
						9
					);
					expect(farmYear.costsUsd).toBeCloseTo(
						farmYear.fieldCostsUsd +
							farmYear.hayCostUsd +
							farmYear.choreLabourUsd +
							farmYear.fixedCostsUsd,
						6
					);
					expect(farmYear.netReturnUsd).toBeCloseTo(farmYear.revenueUsd - farmYear.costsUsd, 6);
					expect(farmYear.labourHours).toBeCloseTo(
						farmYear.fieldLabourHours + farmYear.choreHours,
						9
					);
					farmYear.labourHoursByMonth.forEach((hours, m) => {
						const fieldHours = sum((f) => f.labourHoursByMonth[m]);
						expect(hours).toBeCloseTo(fieldHours + farmYear.choreHoursByMonth[m], 6);
					});
					expect(farmYear.labourHoursByMonth.reduce((s, h) => s + h, 0)).toBeCloseTo(
						farmYear.labourHours,
						6
					);
				}
			})
		);
	});
});
