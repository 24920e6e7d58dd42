import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { evaluatePlan } from '../../src/lib/engine';
import { nonFiniteNumberPaths } from '../../src/lib/engine/finite';
import { parsePlanDocument, type PlanDocumentInput } from '../../src/lib/schemas/plan-file';
import { smallPlanInput } from './fixtures';

function issuesOf(input: unknown) {
	const result = parsePlanDocument(input);
	return result.ok ? [] : result.issues;
}

/** Every message zod would write by itself; none may reach a person. */
const zodDefault =
	/Invalid input|Too (big|small)|expected .*, received|Unrecognized key|Invalid (option|discriminator|string|number)/;

describe('odd but legal inputs', () => {
	it('finds no built-in object property behind an id such as "constructor"', () => {
		const input = smallPlanInput();
		input.operations![0].id = 'constructor';
		for (const practice of input.practices) practice.operations![0].operationId = 'constructor';
		input.practices[0].seed!.seedId = 'constructor';
		for (const set of input.priceSets) {
			Object.assign(set.seedPrices!, { constructor: { usdPerThousandSeeds: 3.6 } });
		}
		const parsed = parsePlanDocument(input);
		expect(parsed.ok).toBe(true);
		if (!parsed.ok) return;
		const result = evaluatePlan(parsed.plan);
		expect(nonFiniteNumberPaths(result)).toEqual([]);
		expect(result.fieldYears[0].directCosts.seedUsd).toBeCloseTo(32 * 3.6 * 80, 9);
	});

	it('refuses a "constructor" seed that has no price instead of reading Object’s', () => {
		const input = smallPlanInput();
		input.practices[0].seed!.seedId = 'constructor';
		expect(issuesOf(input).map((i) => i.path)).toContain(
			'priceSets.0.seedPrices.constructor.usdPerThousandSeeds'
		);
	});

	it.each([
		[
			'fields.0.acres',
			(d: PlanDocumentInput) => (d.fields[0].acres = 1e308),
			/at most 20,000 acres/
		],
		[
			'herd.averageWeightLb',
			(d: PlanDocumentInput) => (d.herd!.averageWeightLb = 1e308),
			/at most 3,000 lb/
		],
		[
			'farm.fixedCostsUsdPerYear',
			(d: PlanDocumentInput) => (d.farm.fixedCostsUsdPerYear = 1e308),
			/at most \$100,000,000 per year/
		],
		[
			'practices.0.nitrogen.response.quadraticBuPerLbN2',
			(d: PlanDocumentInput) =>
				(d.practices[0].nitrogen!.response = {
					interceptBuPerAcre: 115,
					linearBuPerLbN: 0.85,
					quadraticBuPerLbN2: 5e-324
				}),
			/level off by 500 lb N/
		],
		[
			'practices.0.nitrogen.response.linearBuPerLbN',
			(d: PlanDocumentInput) =>
				(d.practices[0].nitrogen!.response = {
					interceptBuPerAcre: 0,
					linearBuPerLbN: 1e-300,
					quadraticBuPerLbN2: 0.0025
				}),
			/at least 0.01 bu per lb N/
		],
		[
			'herd.intakeLbDmPerAuDay',
			(d: PlanDocumentInput) => (d.herd!.intakeLbDmPerAuDay = 5e-324),
			/at least 5 lb dry matter/
		],
		[
			'operations.0.speedMph',
			(d: PlanDocumentInput) => {
				const op = d.operations![0];
				if (op.by === 'own' && op.statedAs === 'machine') op.speedMph = 5e-324;
			},
			/at least 0.5 mph/
		]
	])('refuses %s at an extreme, saying the plausible range', (path, change, message) => {
		const input = smallPlanInput();
		change(input);
		const issue = issuesOf(input).find((i) => i.path === path);
		expect(issue?.message).toMatch(message);
		expect(issue?.message).not.toMatch(zodDefault);
	});

	it('refuses, with the path, a result that would not be a finite number', () => {
		expect(nonFiniteNumberPaths({ a: [1, { b: Infinity }], c: NaN, d: null, e: 'x' })).toEqual([
			'a.1.b',
			'c'
		]);
	});
});

/** A number anywhere in its allowed range, its ends and the smallest steps inside them most of all. */
const within = (min: number, max: number) =>
	fc.oneof(
		fc.constant(min),
		fc.constant(max),
		fc.double({ min, max, noNaN: true, noDefaultInfinity: true })
	);
/** Schema-valid plans with values at and between the ends of every range the schema states. */
const extremePlan = fc
	.record({
		acres: fc.array(within(0.01, 20_000), { minLength: 2, maxLength: 2 }),
		productivity: within(0.1, 3),
		goal: within(0, 500),
		adjustment: within(-100, 100),
		intercept: within(0, 400),
		slope: within(0.01, 5),
		joinLbN: within(0.01, 500),
		applied: fc.oneof(fc.constant('economic-optimum' as const), within(0, 500)),
		cropPrice: within(0.01, 10_000),
		nitrogenPrice: within(0, 20),
		head: fc.integer({ min: 0, max: 20_000 }),
		weight: within(100, 3000),
		intake: within(5, 60),
		seasonDays: fc.integer({ min: 0, max: 366 }),
		baleWeight: within(20, 3000),
		baleDm: within(20, 100),
		waste: within(0, 60),
		biomass: within(0, 20_000),
		utilisation: within(0, 100),
		speed: within(0.5, 30),
		width: within(1, 200),
		efficiency: within(10, 100),
		pto: within(10, 1000),
		fixedCosts: within(0, 100_000_000),
		choreHours: within(0, 24),
		labourRate: within(0, 500),
		labour: within(0, 744),
		interest: within(0, 50)
	})
	.map((v) => {
		const d = smallPlanInput();
		d.fields.forEach((f, i) => (f.acres = v.acres[i]));
		d.fields[1].productivityIndex = v.productivity;
		const corn = d.practices[0];
		corn.yieldGoalPerAcre = v.goal;
		corn.yieldAdjustmentPercent = v.adjustment;
		corn.nitrogen = {
			appliedLbPerAcre: v.applied,
			response: {
				interceptBuPerAcre: v.intercept,
				linearBuPerLbN: v.slope,
				// c from the join point b/(2c), so the curve is one the schema allows
				quadraticBuPerLbN2: Math.min(Math.max(v.slope / (2 * v.joinLbN), v.slope / 999), 0.1)
			}
		};
		d.practices[1].coverMix!.biomassLbDmPerAcre = v.biomass;
		d.practices[1].coverMix!.grazingUtilisationPercent = v.utilisation;
		Object.assign(d.herd!, {
			head: v.head,
			averageWeightLb: v.weight,
			intakeLbDmPerAuDay: v.intake,
			feedingSeasonDays: v.seasonDays,
			baleWeightLb: v.baleWeight,
			baleDryMatterPercent: v.baleDm,
			feedingWastePercent: v.waste,
			choreHoursPerDayFeedingHay: v.choreHours,
			choreHoursPerDayGrazing: v.choreHours
		});
		const spray = d.operations![1];
		if (spray.by === 'own' && spray.statedAs === 'machine') {
			Object.assign(spray, {
				speedMph: v.speed,
				widthFt: v.width,
				fieldEfficiencyPercent: v.efficiency
			});
			spray.fuel = { basis: 'pto-power', tractorMaxPtoHp: v.pto };
		}
		d.farm.fixedCostsUsdPerYear = v.fixedCosts;
		d.farm.labourHoursAvailableByMonth = d.farm.labourHoursAvailableByMonth.map(() => v.labour);
		d.farm.interestRatePercent = v.interest;
		for (const set of d.priceSets) {
			set.cropPricesUsdPerUnit = { corn: v.cropPrice, soybean: v.cropPrice };
			set.nitrogenUsdPerLb = v.nitrogenPrice;
			set.labourUsdPerHour = v.labourRate;
		}
		return d;
	});

describe('thousands of schema-valid plans at the edges of their ranges', () => {
	// 1,500 pairs: 3,000 documents, each parsed and evaluated as a plan or a reference.
	it(
		'parse, evaluate with a partial budget, and hold only finite numbers',
		{ timeout: 120_000 },
		() => {
			fc.assert(
				fc.property(extremePlan, extremePlan, (input, referenceInput) => {
					const plan = parsePlanDocument(input);
					const reference = parsePlanDocument(referenceInput);
					if (!plan.ok) throw new Error(JSON.stringify(plan.issues));
					if (!reference.ok) throw new Error(JSON.stringify(reference.issues));
					const result = evaluatePlan(plan.plan, reference.plan);
					expect(nonFiniteNumberPaths(result)).toEqual([]);
				}),
				{ numRuns: 1500 }
			);
		}
	);
});
