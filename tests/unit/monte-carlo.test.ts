import { readFileSync } from 'node:fs';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { evaluatePlan } from '../../src/lib/engine';
import {
	createMonteCarlo,
	riskModel,
	runMonteCarlo,
	yearNetReturnUsd,
	type DrawFactors,
	type MonteCarloOptions
} from '../../src/lib/engine/risk/monte-carlo';
import { parsePlanDocument, type PlanDocument } from '../../src/lib/schemas/plan-file';
import { oneCornFieldInput, smallPlanInput } from './fixtures';

function parse(input: unknown): PlanDocument {
	const result = parsePlanDocument(input);
	if (!result.ok) throw new Error(JSON.stringify(result.issues));
	return result.plan;
}

const scenario = (name: string) =>
	parse(JSON.parse(readFileSync(`scenarios/${name}.json`, 'utf8')));

/** Only corn's yield moves: no price spread, no link to other crops. */
function cornOnly(
	draws: number,
	corn: Partial<MonteCarloOptions['crops'][number]>,
	seed = 7
): MonteCarloOptions {
	return {
		draws,
		seed,
		sharedWeather: 0,
		sharedMarket: 0,
		crops: [
			{ crop: 'corn', yieldCvPercent: 0, priceCvPercent: 0, priceYieldCorrelation: 0, ...corn }
		]
	};
}

// One 100-acre field, 180 bu/ac at $4.40 (fixtures.ts, invented): revenue $79,200 a year.
const revenueUsd = 100 * 180 * 4.4;

describe('Monte Carlo moments against their closed form', () => {
	const model = riskModel(parse(oneCornFieldInput()));
	const planned = model.years[0].netReturnUsd;
	const n = 20_000;

	it('a normal yield with CV 15 % spreads net return by price × yield × 0.15 × acres', () => {
		const result = runMonteCarlo(model, null, cornOnly(n, { yieldCvPercent: 15 }));
		// Closed form: net = revenue × (1 + 0.15 z) − costs, so sd = 4.40 × 180 × 0.15 × 100 = $11,880.
		const sd = 4.4 * 180 * 0.15 * 100;
		for (const year of result.plan.byYear) {
			// Sampling error of a standard deviation from n normal draws is sd ÷ √(2n) (0.5 % at
			// n = 20,000); 4 of those (2 %) leaves a seed's luck no room to fail a correct engine.
			expect(Math.abs(year.standardDeviationUsd - sd)).toBeLessThan((4 * sd) / Math.sqrt(2 * n));
			// The mean's sampling error is sd ÷ √n.
			expect(Math.abs(year.meanUsd - planned)).toBeLessThan((4 * sd) / Math.sqrt(n));
			// Normal percentiles: the 5th and 95th lie 1.645 sd either side of the mean (error ≈ 1.6 %
			// of sd at n = 20,000 for the 5 % tail, so 4 × that).
			expect(year.percentilesUsd.p95 - planned).toBeCloseTo(1.645 * sd, -3);
			expect(Math.abs(year.percentilesUsd.p5 - (planned - 1.645 * sd))).toBeLessThan(0.07 * sd);
		}
		// Two independent years: the average a year has sd ÷ √2.
		const horizonSd = sd / Math.SQRT2;
		expect(
			Math.abs(result.plan.horizonAverage.standardDeviationUsd - horizonSd) / horizonSd
		).toBeLessThan(4 / Math.sqrt(2 * n));
	});

	it('the loss probability of a year is the normal tail below zero', () => {
		// Fixed costs raised so the planned net return is one sd above zero: P(loss) = Φ(−1).
		const sd = revenueUsd * 0.15;
		const input = oneCornFieldInput();
		input.farm.fixedCostsUsdPerYear = planned - sd;
		const shifted = riskModel(parse(input));
		expect(shifted.years[0].netReturnUsd).toBeCloseTo(sd, 6);
		const result = runMonteCarlo(shifted, null, cornOnly(n, { yieldCvPercent: 15 }));
		// Φ(−1) = 0.158655 (standard normal table); binomial error √(p(1−p)/n) = 0.0026, 4 of those.
		for (const year of result.plan.byYear) {
			expect(Math.abs(year.lossProbability - 0.158655)).toBeLessThan(4 * 0.0026);
		}
		const loss = result.plan.lossYearProbability;
		expect(Math.abs(loss - 0.158655)).toBeLessThan(4 * 0.0026);
		// At least one loss in two independent years: 1 − (1 − 0.158655)² = 0.2921.
		expect(Math.abs(result.plan.anyLossYearProbability - 0.2921)).toBeLessThan(4 * 0.0032);
	});

	it('price and yield correlated: the product of two normals has its closed-form mean and variance', () => {
		const cvY = 0.15;
		const cvP = 0.2;
		for (const rho of [-0.6, 0.6]) {
			const m = 40_000;
			const result = runMonteCarlo(
				model,
				null,
				cornOnly(m, { yieldCvPercent: 15, priceCvPercent: 20, priceYieldCorrelation: rho })
			);
			// For X = 1 + cvY·Zy, Y = 1 + cvP·Zp with corr(Zy, Zp) = ρ (Goodman 1960, product of
			// correlated variables): E[XY] = 1 + ρ·cvY·cvP and
			// Var[XY] = cvY² + cvP² + 2ρ·cvY·cvP + cvY²·cvP²·(1 + ρ²).
			const meanFactor = 1 + rho * cvY * cvP;
			const variance =
				cvY ** 2 + cvP ** 2 + 2 * rho * cvY * cvP + cvY ** 2 * cvP ** 2 * (1 + rho ** 2);
			const sd = revenueUsd * Math.sqrt(variance);
			const year = result.plan.byYear[0];
			expect(Math.abs(year.meanUsd - (planned + revenueUsd * (meanFactor - 1)))).toBeLessThan(
				(4 * sd) / Math.sqrt(m)
			);
			// A product of normals has heavier tails than a normal: allow 3 % (about 6 sampling errors
			// of a normal's sd at n = 40,000) rather than 4 × 0.35 %.
			expect(Math.abs(year.standardDeviationUsd - sd) / sd).toBeLessThan(0.03);
		}
	});

	it('respects the sign of the price–yield correlation', () => {
		const spreadAt = (rho: number) =>
			runMonteCarlo(
				model,
				null,
				cornOnly(n, { yieldCvPercent: 15, priceCvPercent: 20, priceYieldCorrelation: rho })
			).plan.byYear[0];
		const negative = spreadAt(-0.8);
		const positive = spreadAt(0.8);
		// A short crop that sells dear steadies revenue: a negative correlation narrows the spread and
		// (E[XY] = 1 + ρ·cvY·cvP) lowers the mean; a positive one does the opposite.
		expect(negative.standardDeviationUsd).toBeLessThan(positive.standardDeviationUsd * 0.6);
		expect(negative.meanUsd).toBeLessThan(planned);
		expect(positive.meanUsd).toBeGreaterThan(planned);
	});
});

describe('the seeded generator', () => {
	const plan = riskModel(scenario('wide-row-interseeded'));
	const reference = riskModel(scenario('reference'));
	const options: MonteCarloOptions = {
		draws: 2000,
		seed: 12345,
		sharedWeather: 0.5,
		sharedMarket: 0.6,
		crops: []
	};

	it('gives the same answer for the same seed, however the draws are stepped', () => {
		const once = runMonteCarlo(plan, reference, options);
		const stepped = createMonteCarlo(plan, reference, options);
		while (stepped.done < stepped.total) stepped.step(137);
		expect(stepped.result()).toEqual(once);
		expect(runMonteCarlo(plan, reference, options)).toEqual(once);
	});

	it('gives another answer for another seed', () => {
		const a = runMonteCarlo(plan, reference, options);
		const b = runMonteCarlo(plan, reference, { ...options, seed: 54321 });
		expect(b.plan.horizonAverage.meanUsd).not.toEqual(a.plan.horizonAverage.meanUsd);
	});

	it('draws both plans on the same draws: a plan against itself never beats it', () => {
		const result = runMonteCarlo(plan, plan, options);
		expect(result.beatsReferenceProbability).toBe(0);
		expect(result.reference!.horizonAverage).toEqual(result.plan.horizonAverage);
	});

	it('answers finite numbers and percentiles in order', () => {
		const result = runMonteCarlo(plan, reference, options);
		for (const risk of [result.plan, result.reference!]) {
			for (const s of [...risk.byYear, risk.horizonAverage]) {
				const p = s.percentilesUsd;
				expect([p.p5, p.p25, p.p50, p.p75, p.p95].every(Number.isFinite)).toBe(true);
				expect(p.p5 <= p.p25 && p.p25 <= p.p50 && p.p50 <= p.p75 && p.p75 <= p.p95).toBe(true);
			}
			expect(risk.histogram.reduce((sum, bin) => sum + bin.draws, 0)).toBe(options.draws);
		}
		expect(result.beatsReferenceProbability).toBeGreaterThanOrEqual(0);
		expect(result.beatsReferenceProbability).toBeLessThanOrEqual(1);
	});
});

/**
 * The plan file with one year's draw applied the long way: the year's crop prices scaled in its price
 * set, and every practice of a crop given the yield adjustment that scales its yield.
 */
function drawnDocument(doc: PlanDocument, year: number, factors: Map<string, DrawFactors>) {
	const drawn = structuredClone(doc);
	const set = drawn.priceSets.find((p) => p.year === year)!;
	for (const [crop, f] of factors) {
		if (set.cropPricesUsdPerUnit[crop] !== undefined) set.cropPricesUsdPerUnit[crop] *= f.price;
		for (const practice of drawn.practices) {
			if (practice.crop !== crop) continue;
			practice.yieldAdjustmentPercent =
				((1 + practice.yieldAdjustmentPercent / 100) * f.yield - 1) * 100;
		}
	}
	return drawn;
}

const factorArbitrary = fc.record({
	price: fc.double({ min: 0.3, max: 1.8, noNaN: true }),
	yield: fc.double({ min: 0.3, max: 1.8, noNaN: true })
});

/** N held at a stated rate, as the Monte Carlo holds it: a drawn price does not move it. */
function fixedNitrogen(input: ReturnType<typeof smallPlanInput>) {
	for (const practice of input.practices) {
		if (practice.nitrogen?.appliedLbPerAcre === 'economic-optimum') {
			practice.nitrogen.appliedLbPerAcre = 150;
		}
	}
	return input;
}

describe('the precomputed coefficients against a full evaluation of the drawn plan', () => {
	it('a year with a herd: revenue and hay (residue follows yield) match evaluatePlan', () => {
		const input = fixedNitrogen(smallPlanInput());
		input.plan.horizon.years = 1;
		input.priceSets = input.priceSets.slice(0, 1);
		// A small herd, so that the drawn residue decides how much hay is bought.
		input.herd!.head = 25;
		const doc = parse(input);
		const model = riskModel(doc);
		fc.assert(
			fc.property(factorArbitrary, factorArbitrary, (corn, soybean) => {
				const factors = new Map([
					['corn', corn],
					['soybean', soybean]
				]);
				const full = evaluatePlan(drawnDocument(doc, 2027, factors)).farmYears[0];
				expect(yearNetReturnUsd(model.years[0], factors)).toBeCloseTo(full.netReturnUsd, 4);
			}),
			{ numRuns: 60 }
		);
	});

	it('every year of the demo farm’s plans without a herd matches evaluatePlan year by year', () => {
		for (const name of ['reference', 'wide-row-interseeded', 'small-grain-peas']) {
			const doc = scenario(name);
			doc.herd = null;
			for (const practice of doc.practices) {
				if (practice.nitrogen.appliedLbPerAcre === 'economic-optimum') {
					practice.nitrogen.appliedLbPerAcre = 140;
				}
			}
			const model = riskModel(doc);
			fc.assert(
				fc.property(fc.dictionary(fc.constantFrom(...model.crops), factorArbitrary), (drawn) => {
					const factors = new Map(Object.entries(drawn));
					model.years.forEach((year, i) => {
						const full = evaluatePlan(drawnDocument(doc, year.year, factors)).farmYears[i];
						expect(yearNetReturnUsd(year, factors)).toBeCloseTo(full.netReturnUsd, 4);
					});
				}),
				{ numRuns: 15 }
			);
		}
	});

	it('factors of 1 give back the plan’s own net return in every year', () => {
		const model = riskModel(scenario('wide-row-interseeded'));
		const evaluated = evaluatePlan(scenario('wide-row-interseeded'));
		model.years.forEach((year, i) => {
			expect(yearNetReturnUsd(year, new Map())).toBeCloseTo(evaluated.farmYears[i].netReturnUsd, 6);
		});
	});
});
