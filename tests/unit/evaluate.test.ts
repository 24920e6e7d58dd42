import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { evaluatePlan } from '../../src/lib/engine';
import { seedsPerFootOfRow } from '../../src/lib/engine/field-year';
import { parsePlanDocument, type PlanDocument } from '../../src/lib/schemas/plan-file';
import { oneCornFieldInput, smallPlanInput } from './fixtures';

function parse(input: unknown): PlanDocument {
	const result = parsePlanDocument(input);
	if (!result.ok) throw new Error(JSON.stringify(result.issues));
	return result.plan;
}

describe('a published worked example as a plan file', () => {
	it('grazes the UNL corn stalks at 1.76 AUM per acre', () => {
		const plan = parse(JSON.parse(readFileSync('tests/unit/plans/unl-corn-residue.json', 'utf8')));
		const { fieldYears, farmYears } = evaluatePlan(plan);
		// UNL (Rasby 2007): 150 bu × 16 lb × 50 % = 1,200 lb DM/ac; ÷ 680 lb per AUM = 1.76 AUM/ac
		expect(fieldYears[0].forage.residueLbDmPerAcre).toBeCloseTo(1200, 9);
		expect(fieldYears[0].forage.grazingAums / fieldYears[0].acres).toBeCloseTo(1.76, 2);
		// 100 ac × 1.7647 AUM × 30 days = 5,294 AU-days, less than 50 AU × 120 days
		expect(farmYears[0].grazingAuDays).toBeCloseTo((100 * 1200 * 30) / 680, 6);
		expect(farmYears[0].grazingDays).toBeCloseTo((100 * 1200 * 30) / 680 / 50, 6);
	});
});

describe('economic optimum N through a plan', () => {
	it('buys the EONR less credits and yields 182.5 bu/ac', () => {
		const input = oneCornFieldInput();
		// REFERENCE-VALUES §4b synthetic: Y = 100 + 1.0 N − 0.003 N², plateau 183.33 bu/ac; R = 0.40/4.00 = 0.10
		input.practices[0].yieldGoalPerAcre = 100 + 1 / (4 * 0.003);
		input.practices[0].nitrogen = {
			appliedLbPerAcre: 'economic-optimum',
			response: { interceptBuPerAcre: 100, linearBuPerLbN: 1.0, quadraticBuPerLbN2: 0.003 }
		};
		input.fields[0].priorCropNitrogenCreditLbPerAcre = 30;
		for (const set of input.priceSets) {
			set.nitrogenUsdPerLb = 0.4;
			set.cropPricesUsdPerUnit = { corn: 4 };
		}
		const [first, second] = evaluatePlan(parse(input)).fieldYears;
		// EONR = (1.0 − 0.10)/(2 × 0.003) = 150 lb N/ac available; 30 lb credit → 120 lb bought
		expect(first.nitrogen.priceRatio).toBeCloseTo(0.1, 12);
		expect(first.nitrogen.economicOptimumLbPerAcre).toBeCloseTo(150, 9);
		expect(first.nitrogen.appliedLbPerAcre).toBeCloseTo(120, 9);
		expect(first.nitrogen.purchasedLb).toBeCloseTo(12000, 6);
		expect(first.yieldPerAcre).toBeCloseTo(182.5, 9);
		expect(first.directCosts.nitrogenUsd).toBeCloseTo(12000 * 0.4, 6);
		// no credit the second year: the whole 150 lb is bought
		expect(second.nitrogen.appliedLbPerAcre).toBeCloseTo(150, 9);
	});
});

describe('legume cover credit carried to the next crop', () => {
	it('credits 52.5 lb N/ac after 3,000 lb of vetch and cuts the N bought by as much', () => {
		const input = oneCornFieldInput();
		input.practices[0].nitrogen = {
			appliedLbPerAcre: 'economic-optimum',
			response: { interceptBuPerAcre: 100, linearBuPerLbN: 1.0, quadraticBuPerLbN2: 0.003 }
		};
		input.practices[0].coverMix = {
			species: [{ seedId: 'rye', lbPerAcre: 20 }],
			biomassLbDmPerAcre: 3000,
			legumeSharePercent: 100,
			legumeNitrogenPercent: 3.5,
			nitrogenAvailablePercent: 50
		};
		for (const set of input.priceSets) set.seedPrices = { rye: { usdPerLb: 0.3 } };
		const [first, second] = evaluatePlan(parse(input)).fieldYears;
		// SARE MCCP arithmetic: 3,000 lb × 3.5 % ÷ 2 = 52.5 lb N/ac, credited the year after the cover
		expect(first.nitrogen.coverCreditLbPerAcre).toBe(0);
		expect(second.nitrogen.coverCreditLbPerAcre).toBeCloseTo(52.5, 9);
		expect(first.nitrogen.appliedLbPerAcre - second.nitrogen.appliedLbPerAcre).toBeCloseTo(52.5, 9);
	});
});

describe('partial budget', () => {
	it('adds $20.60/ac for drilling a rye cover at 30 lb of $0.25 seed', () => {
		const reference = parse(oneCornFieldInput());
		const input = oneCornFieldInput();
		input.operations!.push({
			id: 'drill-rye',
			name: 'Drill rye (custom)',
			by: 'custom',
			month: 10
		});
		input.practices[0].operations = [{ operationId: 'drill-rye' }];
		input.practices[0].coverMix = {
			species: [{ seedId: 'rye', lbPerAcre: 30 }],
			biomassLbDmPerAcre: 0,
			legumeSharePercent: 0
		};
		for (const set of input.priceSets) {
			set.seedPrices!.rye = { usdPerLb: 0.25 };
			set.customRatesUsdPerAcre!['drill-rye'] = 13.1;
		}
		input.plan.name = 'With rye cover';
		const budget = evaluatePlan(parse(input), reference).partialBudget!;
		// farmdoc daily (6):126, 2016: drilling $13.10 + 30 lb × $0.25 = $7.50 → $20.60 per acre
		expect(budget.average.perAcre.addedCostsUsd).toBeCloseTo(20.6, 9);
		// Corn keeps its place, so each input is one net line of the corn enterprise
		expect(budget.average.lines.addedCosts).toEqual([
			{
				enterprise: 'corn',
				category: 'custom-hire',
				item: 'Corn: custom hire',
				amountUsd: expect.closeTo(1310, 9)
			},
			{
				enterprise: 'corn',
				category: 'cover-seed',
				item: 'Corn: cover crop seed',
				amountUsd: expect.closeTo(750, 9)
			}
		]);
		expect(budget.years[0].netChangeUsd).toBeCloseTo(-2060, 9);
		expect(budget.referencePlanName).toBe('Test plan');
	});

	it('counts $3,000 of hay saved, $30/ac, when the herd grazes 100 acres of stalks for 30 days', () => {
		const input = oneCornFieldInput();
		// 80 AU × 22 lb DM = 1,760 lb DM/day = two 1,000 lb bales at 88 % DM a day; hay $50 a bale
		input.herd = {
			head: 80,
			averageWeightLb: 1000,
			intakeLbDmPerAuDay: 22,
			feedingSeasonStartMonth: 11,
			feedingSeasonDays: 30,
			baleWeightLb: 1000,
			baleDryMatterPercent: 88,
			feedingWastePercent: 0,
			choreHoursPerDayFeedingHay: 1,
			choreHoursPerDayGrazing: 1
		};
		for (const set of input.priceSets) set.hayUsdPerBale = 50;
		const reference = parse(input);
		input.practices[0].residueGrazing = {};
		const result = evaluatePlan(parse(input), reference);
		const budget = result.partialBudget!;
		const referenceYear = evaluatePlan(reference).farmYears[0];
		// Common practice, no published source: 2 bales/day × 30 days × $50 = $3,000; over 100 ac = $30/ac
		expect(referenceYear.hayBales).toBeCloseTo(60, 9);
		expect(referenceYear.hayCostUsd).toBeCloseTo(3000, 6);
		expect(result.farmYears[0].hayBales).toBe(0);
		expect(budget.years[0].lines.reducedCosts).toEqual([
			{
				enterprise: 'herd',
				category: 'hay',
				item: 'Herd: purchased hay',
				amountUsd: expect.closeTo(3000, 6)
			}
		]);
		// The practitioner's own reckoning, per farm-year: bales and dollars avoided, per grazed acre
		expect(result.farmYears[0].hayBalesAvoided).toBeCloseTo(60, 9);
		expect(result.farmYears[0].hayUsdAvoided).toBeCloseTo(3000, 6);
		expect(result.farmYears[0].grazedAcres).toBe(100);
		expect(result.farmYears[0].hayUsdAvoidedPerGrazedAcre).toBeCloseTo(30, 8);
		expect(referenceYear.hayUsdAvoided).toBe(0);
		expect(budget.years[0].perAcre.reducedCostsUsd).toBeCloseTo(30, 8);
		expect(budget.years[0].perAcre.netChangeUsd).toBeCloseTo(30, 8);
	});

	it('keeps the four-part arithmetic: net change = added returns + reduced costs − added costs − reduced returns', () => {
		const reference = parse(smallPlanInput());
		const input = smallPlanInput();
		input.practices[0].yieldGoalPerAcre = 200;
		input.practices[1].chemicalsUsdPerAcre = 30;
		input.priceSets[1].dieselUsdPerGallon = 4.5;
		const result = evaluatePlan(parse(input), reference);
		const budget = result.partialBudget!;
		const referenceResult = evaluatePlan(reference);
		for (const [i, year] of budget.years.entries()) {
			// NDSU (Saxowsky) four sections: positive side − negative side
			expect(year.netChangeUsd).toBeCloseTo(
				year.addedReturnsUsd + year.reducedCostsUsd - year.addedCostsUsd - year.reducedReturnsUsd,
				6
			);
			expect(year.netChangeUsd).toBeCloseTo(
				result.farmYears[i].netReturnUsd - referenceResult.farmYears[i].netReturnUsd,
				6
			);
			expect(year.addedReturnsUsd).toBeGreaterThan(0);
			expect(year.lines.reducedCosts.map((l) => l.item)).toContain('Soybean: chemicals');
		}
		const dieselLines = (y: number) =>
			budget.years[y].lines.addedCosts.filter((l) => l.category === 'diesel');
		expect(
			dieselLines(1)
				.map((l) => l.item)
				.sort()
		).toEqual(['Corn: diesel', 'Soybean: diesel']);
		expect(dieselLines(0)).toEqual([]);
		const meanNet = (budget.years[0].netChangeUsd + budget.years[1].netChangeUsd) / 2;
		expect(budget.average.netChangeUsd).toBeCloseTo(meanNet, 6);
		expect(budget.average.perAcre.netChangeUsd).toBeCloseTo(meanNet / 200, 6);
	});

	it('refuses a reference that does not cover the plan years', () => {
		const reference = smallPlanInput();
		reference.plan.horizon.years = 1;
		expect(() => evaluatePlan(parse(smallPlanInput()), parse(reference))).toThrow(
			/does not cover 2028/
		);
	});
});

describe('rows and seed', () => {
	it('puts twice the seeds per foot of row in 60-inch rows', () => {
		// Common practice, no published source: 30,000 seeds/ac in 60-in rows → twice the seeds per foot of 30-in rows
		expect(seedsPerFootOfRow(30000, 60) / seedsPerFootOfRow(30000, 30)).toBeCloseTo(2, 12);
		// 43,560 ft² ÷ 5 ft = 8,712 ft of row per acre → 3.44 seeds per foot
		expect(seedsPerFootOfRow(30000, 60)).toBeCloseTo(3.44, 2);
	});
});

describe('a field-year of the small plan', () => {
	const result = evaluatePlan(parse(smallPlanInput()));
	const eastCorn = result.fieldYears.find((f) => f.fieldId === 'east' && f.year === 2027)!;

	it('costs each operation by its own arithmetic', () => {
		const spray = eastCorn.operations.find((o) => o.operationId === 'spray')!;
		// ASABE D497: 8 mph × 90 ft × 0.65 ÷ 8.25 = 56.7 ac/h; 2 passes over 80 ac
		expect(spray.fieldCapacityAcresPerHour).toBeCloseTo((8 * 90 * 0.65) / 8.25, 9);
		expect(spray.machineHours).toBeCloseTo(160 / ((8 * 90 * 0.65) / 8.25), 9);
		// ISU A3-29: 0.044 gal/h per PTO hp × 120 hp × machine hours
		expect(spray.dieselGallons).toBeCloseTo(0.044 * 120 * spray.machineHours, 9);
		const harvest = eastCorn.operations.find((o) => o.operationId === 'harvest')!;
		expect(harvest.customHireUsd).toBe(38 * 80);
		expect(eastCorn.labourHoursByMonth[5]).toBeCloseTo(spray.machineHours * 1.1, 9);
	});

	it('charges operating interest on the cash costs for the months carried', () => {
		const d = eastCorn.directCosts;
		const cash =
			d.seedUsd +
			d.nitrogenUsd +
			d.otherFertiliserUsd +
			d.chemicalsUsd +
			d.otherDirectUsd +
			d.coverSeedUsd +
			d.customHireUsd +
			eastCorn.operationCosts.fuelUsd +
			eastCorn.operationCosts.repairsUsd;
		// 8 % a year for the default 6 months (common practice, no published source)
		expect(d.operatingInterestUsd).toBeCloseTo(cash * 0.08 * 0.5, 6);
		expect(d.seedUsd).toBeCloseTo(32 * 3.6 * 80, 9);
		expect(eastCorn.seedsPerFootOfRow).toBeCloseTo(32000 / (43560 / 2.5), 9);
	});
});
