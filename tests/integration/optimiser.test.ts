// The optimiser through `optimisePlan` (HiGHS in its worker thread), checked against GLPK 5.0 glpsol
// (Debian package glpk-utils) on the LP file of the same model, against javascript-lp-solver 1.0.3
// (npm) on the continuous model, against re-solves with a limit moved (marginal values), and against
// the engine's own evaluation of the plan a whole-field answer makes.
import { describe, expect, it } from 'vitest';
import { evaluatePlan } from '../../src/lib/engine';
import { lpName, type FarmModel } from '../../src/lib/engine/optimiser/farm-model';
import type { LinearModel } from '../../src/lib/engine/optimiser/linear-model';
import { writeLpFile } from '../../src/lib/engine/optimiser/lp-format';
import type { OptimiseResult, TradeOffLine } from '../../src/lib/engine/optimiser/types';
import {
	optimiseOptionsSchema,
	tradeOffSchema,
	type OptimiseOptionsInput
} from '../../src/lib/schemas/optimise';
import type { PlanDocument } from '../../src/lib/schemas/plan-file';
import { optimisePlan, tradeOffCurve } from '../../src/lib/server/optimiser/optimise';
import { generatedFarm } from '../support/generated-farm';
import {
	glpsol,
	relativeDifference,
	scenarioNames,
	scenarioPlan,
	smallFarm,
	solveWithJsLp,
	withFieldRotations
} from '../support/optimiser';

async function optimised(plan: PlanDocument, options: OptimiseOptionsInput = {}) {
	const answer = await optimisePlan(plan, optimiseOptionsSchema.parse(options));
	if (!answer.ok) throw new Error(JSON.stringify(answer.issues));
	return answer;
}

/** a ≤ b, but for the last digits' rounding. */
const atMost = (a: number, b: number) => a <= b + 1e-9 * Math.max(1, Math.abs(b));
const sum = (values: number[]) => values.reduce((a, b) => a + b, 0);

/** The share columns' values as the result's fields state them (acres ÷ the field's acres). */
function shareValues(plan: PlanDocument, result: OptimiseResult): Map<string, number> {
	const shares = new Map<string, number>();
	for (const field of result.fields) {
		const acres = plan.fields.find((f) => f.id === field.fieldId)!.acres;
		for (const r of field.rotations) {
			const name = `share_${lpName(field.fieldId)}_${lpName(r.rotationId)}_p${r.startingPhase}`;
			shares.set(name, r.acres / acres);
		}
	}
	return shares;
}

/** The model with every field's shares held where the answer put them. */
function withSharesHeld(model: LinearModel, shares: Map<string, number>): LinearModel {
	return {
		...model,
		columns: model.columns.map((c) => {
			if (!c.name.startsWith('share_')) return c;
			const value = Math.round(shares.get(c.name) ?? 0);
			return { ...c, lower: value, upper: value };
		})
	};
}

/** The whole-field answer as the plan's own field rotations. */
function planOf(plan: PlanDocument, result: OptimiseResult): PlanDocument {
	return withFieldRotations(
		plan,
		result.fields.map((f) => {
			expect(f.rotations).toHaveLength(1);
			const [r] = f.rotations;
			return { fieldId: f.fieldId, rotationId: r.rotationId, startingPhase: r.startingPhase };
		})
	);
}

/** Forage the chosen mix offers each year (AU-days), from the choices' field-year budgets. */
function offeredAuDays(farm: FarmModel, result: OptimiseResult): number[] {
	const shares = shareValues(farm.plan, result);
	return farm.years.map((_, y) =>
		sum(
			farm.choices.map((c) => {
				const name = farm.model.columns[c.column].name;
				return (shares.get(name) ?? 0) * c.years[y].grazingAuDays;
			})
		)
	);
}

const farms: [string, () => PlanDocument][] = [
	['the small farm', () => smallFarm()],
	...scenarioNames.map((name): [string, () => PlanDocument] => [
		`scenarios/${name}.json`,
		() => scenarioPlan(name)
	]),
	// The four scenarios' rotations on one farm of the demo's 14 fields.
	['generatedFarm(14, 4)', () => generatedFarm(14, 4)]
];

describe('HiGHS against glpsol and javascript-lp-solver', () => {
	it.each(farms)('%s: the same optimum, continuous and whole fields', async (_, make) => {
		const plan = make();
		const continuous = await optimised(plan);
		expect(continuous.result.status).toBe('optimal');
		const glpk = await glpsol(writeLpFile(continuous.farm.model));
		expect(glpk.status).toBe('optimal');
		expect(relativeDifference(continuous.result.objectiveUsd!, glpk.objective)).toBeLessThan(1e-6);
		const jsLp = solveWithJsLp(continuous.farm.model).objective!;
		expect(relativeDifference(continuous.result.objectiveUsd!, jsLp)).toBeLessThan(1e-6);

		// Whole fields to a gap of 0, so both solvers must prove the same optimum.
		const whole = await optimised(plan, { wholeFields: true, gapPercent: 0 });
		expect(whole.result.status).toBe('optimal');
		expect(whole.result.model.integerColumns).toBeGreaterThan(0);
		const glpkWhole = await glpsol(writeLpFile(whole.farm.model));
		expect(glpkWhole.status).toBe('optimal');
		expect(glpkWhole.report).toContain('INTEGER OPTIMAL');
		expect(relativeDifference(whole.result.objectiveUsd!, glpkWhole.objective)).toBeLessThan(1e-6);
		expect(atMost(whole.result.objectiveUsd!, glpk.objective)).toBe(true);
	});

	it('generatedFarm(100, 8): the same LP optimum, and a whole-field answer glpsol prices the same', async () => {
		const plan = generatedFarm(100, 8);
		const continuous = await optimised(plan);
		expect(continuous.result.status).toBe('optimal');
		expect(continuous.result.model.columns).toBeGreaterThan(1800);
		const glpk = await glpsol(writeLpFile(continuous.farm.model));
		expect(relativeDifference(continuous.result.objectiveUsd!, glpk.objective)).toBeLessThan(1e-6);
		// javascript-lp-solver is left out here: its dense tableau (≈2,000 columns, and a row for each
		// column's bound) did not finish in minutes. glpsol proving the whole-field optimum took over five
		// minutes too, so the whole-field answer is checked three ways that glpsol does quickly:
		const whole = await optimised(plan, { wholeFields: true });
		const { objectiveUsd, bestBoundUsd, gapPercent } = whole.result;
		expect(whole.result.status).toBe('optimal');
		// 1. its choices, held fixed in the LP file, give glpsol the same objective;
		const held = await glpsol(
			writeLpFile(withSharesHeld(whole.farm.model, shareValues(plan, whole.result)))
		);
		expect(held.status).toBe('optimal');
		expect(relativeDifference(objectiveUsd!, held.objective)).toBeLessThan(1e-6);
		// 2. no whole-field answer beats glpsol's LP relaxation, and HiGHS's bound is not above it;
		const relaxed = await glpsol(writeLpFile(whole.farm.model), { relaxed: true });
		expect(relativeDifference(relaxed.objective, glpk.objective)).toBeLessThan(1e-6);
		expect(atMost(objectiveUsd!, relaxed.objective)).toBe(true);
		expect(atMost(bestBoundUsd!, relaxed.objective)).toBe(true);
		// 3. it is within the gap asked for (the default) of that bound.
		const asked = optimiseOptionsSchema.parse({}).gapPercent;
		expect(gapPercent!).toBeLessThanOrEqual(asked);
		expect(objectiveUsd!).toBeGreaterThanOrEqual(relaxed.objective * (1 - asked / 100));
	});
});

describe('marginal values of binding limits', () => {
	// The four scenarios' rotations: moving fields between them trades N against October work.
	const plan = generatedFarm(14, 4);

	// Each cap alone, set below what the free optimum uses so that it binds (found by trying: with both
	// set at once, one or the other takes the whole adjustment and the other has no value).
	const cases = [
		{
			name: 'purchased N, 80 % of the free optimum’s most in a year',
			prefix: 'nitrogen_',
			unit: 'lb N',
			used: (y: OptimiseResult['years'][number]) => y.nitrogenPurchasedLb,
			share: 0.8,
			limits: (limit: number): OptimiseOptionsInput['limits'] => ({
				nitrogenPurchasedLbPerYear: limit
			})
		},
		{
			name: 'family hours in October, 95 % of the free optimum’s most',
			prefix: 'family_labour_span_',
			unit: 'hour',
			used: (y: OptimiseResult['years'][number]) => y.familyLabourHoursByMonth[9],
			share: 0.95,
			limits: (limit: number): OptimiseOptionsInput['limits'] => ({
				familyLabourSpan: { months: [10], maxHours: limit }
			})
		}
	];

	it.each(cases)('$name: raising it by δ adds its marginal value × δ', async (c) => {
		const free = await optimised(plan);
		const limit = c.share * Math.max(...free.result.years.map(c.used));
		const capped = await optimised(plan, { limits: c.limits(limit) });
		expect(capped.result.status).toBe('optimal');
		const binding = capped.result.bindingLimits.filter((b) => b.name.startsWith(c.prefix));
		expect(binding.length).toBeGreaterThan(0);
		for (const b of binding) {
			// A cap that binds holds the answer back: one more unit is worth something.
			expect(b.marginalValueUsd).toBeGreaterThan(0);
			expect(b).toMatchObject({ unit: c.unit, limit });
		}
		expect(capped.result.objectiveUsd!).toBeLessThan(free.result.objectiveUsd!);

		// The cap is one row a year: raised by δ, the objective moves by the sum of their values.
		const delta = limit * 1e-4;
		const raised = await optimised(plan, { limits: c.limits(limit + delta) });
		const actual = raised.result.objectiveUsd! - capped.result.objectiveUsd!;
		const predicted = delta * sum(binding.map((b) => b.marginalValueUsd));
		expect(Math.abs(actual - predicted)).toBeLessThan(
			1e-3 * predicted + 1e-9 * Math.abs(capped.result.objectiveUsd!)
		);
	});
});

describe('answers in the farm’s terms', () => {
	it('a whole-field answer, made into a plan, has the net return the engine evaluates', async () => {
		for (const plan of [generatedFarm(14, 4), smallFarm()]) {
			const whole = await optimised(plan, { wholeFields: true, gapPercent: 0 });
			// The model takes every AU-day offered as eaten (for N credits): here the herd eats it all.
			const offered = offeredAuDays(whole.farm, whole.result);
			whole.result.years.forEach((y, i) => {
				expect(Math.abs(y.grazingAuDays - offered[i])).toBeLessThan(1e-6 * (1 + offered[i]));
			});
			const evaluated = evaluatePlan(planOf(plan, whole.result));
			const netReturn = sum(evaluated.farmYears.map((y) => y.netReturnUsd));
			expect(relativeDifference(whole.result.netReturnUsd!, netReturn)).toBeLessThan(1e-3);
			evaluated.farmYears.forEach((y, i) => {
				const year = whole.result.years[i];
				expect(year.year).toBe(y.year);
				expect(relativeDifference(year.nitrogenPurchasedLb, y.nitrogenPurchasedLb)).toBeLessThan(
					1e-6
				);
				expect(relativeDifference(year.dieselGallons, y.dieselGallons)).toBeLessThan(1e-6);
				expect(relativeDifference(year.hayBales, y.hayBales)).toBeLessThan(1e-6);
				expect(relativeDifference(year.labourHours, y.labourHours)).toBeLessThan(1e-6);
			});
		}
	});

	it('a continuous answer that splits a field says so, and each field’s acres add up', async () => {
		const plan = generatedFarm(14, 4);
		const free = await optimised(plan);
		const nitrogen = 0.85 * Math.max(...free.result.years.map((y) => y.nitrogenPurchasedLb));
		const { result } = await optimised(plan, { limits: { nitrogenPurchasedLbPerYear: nitrogen } });
		expect(result.status).toBe('optimal');
		const split = result.fields.filter((f) => f.rotations.length > 1);
		expect(split.length).toBeGreaterThan(0);
		for (const field of result.fields) {
			expect(field.split).toBe(field.rotations.length > 1);
			expect(field.acres).toBe(plan.fields.find((f) => f.id === field.fieldId)!.acres);
			expect(Math.abs(sum(field.rotations.map((r) => r.acres)) - field.acres)).toBeLessThan(1e-6);
			// Largest first.
			const acres = field.rotations.map((r) => r.acres);
			expect(acres).toEqual([...acres].sort((a, b) => b - a));
		}
	});

	it('limits no mix can keep give status infeasible and name the limits, as glpsol agrees', async () => {
		const plan = scenarioPlan('reference');
		// Corn (in every year, on one phase or the other) needs purchased N; the herd and the fields
		// need family hours, and the reference farm hires nobody.
		const cases: [OptimiseOptionsInput['limits'], string][] = [
			[{ nitrogenPurchasedLbPerYear: 0 }, 'nitrogen_'],
			[{ familyLabourHoursByMonth: Array(12).fill(0) }, 'family_labour_']
		];
		for (const [limits, prefix] of cases) {
			for (const wholeFields of [false, true]) {
				const { result, farm } = await optimised(plan, { wholeFields, limits });
				expect(result.status).toBe('infeasible');
				expect(result.objectiveUsd).toBeNull();
				expect(result.fields).toEqual([]);
				expect(result.conflicts.length).toBeGreaterThan(0);
				expect(result.conflicts.some((c) => c.name.startsWith(prefix))).toBe(true);
				for (const conflict of result.conflicts) expect(conflict.label).not.toBe('');
				expect((await glpsol(writeLpFile(farm.model))).status).toBe('infeasible');
			}
		}
	});
});

describe('the trade-off curve', () => {
	const plan = scenarioPlan('reference');

	async function curve(from: number, to: number) {
		const request = tradeOffSchema.parse({ sweep: { limit: 'nitrogen', from, to, points: 20 } });
		const built = tradeOffCurve(plan, request);
		if (!built.ok) throw new Error(JSON.stringify(built.issues));
		const lines: TradeOffLine[] = [];
		await built.run((line) => lines.push(line));
		return lines;
	}

	async function mostNitrogen() {
		const free = await optimised(plan);
		return Math.max(...free.result.years.map((y) => y.nitrogenPurchasedLb));
	}

	it('sends progress, 20 points with net return rising with the N limit, then done', async () => {
		const most = await mostNitrogen();
		const lines = await curve(0.75 * most, 1.2 * most);
		expect(lines[0]).toEqual({ type: 'progress', done: 0, total: 20 });
		expect(lines.at(-1)!.type).toBe('done');
		const points = lines.flatMap((l) => (l.type === 'point' ? [l] : []));
		expect(points.map((p) => p.index)).toEqual([...Array(20).keys()]);
		const progress = lines.flatMap((l) => (l.type === 'progress' ? [l.done] : []));
		expect(progress).toEqual([...Array(21).keys()]);
		for (let k = 1; k < points.length; k++) {
			expect(points[k].point.limit).toBeGreaterThan(points[k - 1].point.limit);
		}
		const answered = points.filter((p) => p.point.result.status === 'optimal');
		expect(answered.length).toBe(20);
		for (let k = 1; k < answered.length; k++) {
			const [before, after] = [answered[k - 1].point.result, answered[k].point.result];
			expect(after.netReturnUsd!).toBeGreaterThanOrEqual(before.netReturnUsd! - 1e-6);
		}
		// The last points lie beyond what the unconstrained optimum needs: all equal, the free optimum.
		const free = await optimised(plan);
		expect(
			relativeDifference(answered.at(-1)!.point.result.objectiveUsd!, free.result.objectiveUsd!)
		).toBeLessThan(1e-9);
		expect(answered[0].point.result.netReturnUsd!).toBeLessThan(free.result.netReturnUsd!);

		// Each point is the optimum a fresh solve finds with the limit set there.
		for (const k of [0, 7, 13]) {
			const { limit, result } = points[k].point;
			const fresh = await optimised(plan, { limits: { nitrogenPurchasedLbPerYear: limit } });
			expect(relativeDifference(result.objectiveUsd!, fresh.result.objectiveUsd!)).toBeLessThan(
				1e-6
			);
		}

		// Where the plan as it stands falls: its own most N in a year and its net return.
		const done = lines.at(-1) as Extract<TradeOffLine, { type: 'done' }>;
		const evaluated = evaluatePlan(plan);
		expect(done.current.limit).toBeCloseTo(
			Math.max(...evaluated.farmYears.map((y) => y.nitrogenPurchasedLb)),
			6
		);
		expect(done.current.netReturnUsd).toBeCloseTo(
			sum(evaluated.farmYears.map((y) => y.netReturnUsd)),
			6
		);
	});

	it('points below any feasible N are infeasible answers, not failures', async () => {
		const lines = await curve(0, 0.5 * (await mostNitrogen()));
		const points = lines.flatMap((l) => (l.type === 'point' ? [l.point] : []));
		expect(points).toHaveLength(20);
		expect(points[0].result.status).toBe('infeasible');
		expect(points[0].result.conflicts.some((c) => c.name.startsWith('nitrogen_'))).toBe(true);
		expect(lines.at(-1)!.type).toBe('done');
	});

	// Bug (reported): each point's binding limits are read against the model built at the sweep's
	// end (`to`), so `limit` says `to` at every point instead of the point's own limit.
	it('states, at each point, the limit the point was solved with', async () => {
		const most = await mostNitrogen();
		const lines = await curve(0.75 * most, 1.2 * most);
		const points = lines.flatMap((l) => (l.type === 'point' ? [l.point] : []));
		const bound = points.filter((p) => p.result.bindingLimits.length > 0);
		expect(bound.length).toBeGreaterThan(0);
		for (const point of bound) {
			for (const limit of point.result.bindingLimits) expect(limit.limit).toBe(point.limit);
		}
	});
});
