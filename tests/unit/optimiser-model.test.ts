// The whole-farm model without HiGHS: a small farm whose optimum is reasoned out from each field's
// choice coefficients (and found again by evaluating every whole-field plan with the engine), the LP
// file read back, and two outside solvers on it: GLPK 5.0 glpsol (Debian package glpk-utils) on the
// LP file and javascript-lp-solver 1.0.3 (npm) on the same model in its own JSON form.
import { describe, expect, it } from 'vitest';
import { evaluatePlan, planLookups } from '../../src/lib/engine';
import { animalUnits } from '../../src/lib/engine/forage';
import { buildFarmModel, type FarmModel } from '../../src/lib/engine/optimiser/farm-model';
import { writeLpFile } from '../../src/lib/engine/optimiser/lp-format';
import { optimiseOptionsSchema, type OptimiseOptionsInput } from '../../src/lib/schemas/optimise';
import type { PlanDocument } from '../../src/lib/schemas/plan-file';
import { generatedFarm } from '../support/generated-farm';
import {
	glpsol,
	readLpFile,
	relativeDifference,
	scenarioNames,
	scenarioPlan,
	smallFarm,
	solveWithJsLp,
	withFieldRotations
} from '../support/optimiser';

function farmModel(plan: PlanDocument, options: OptimiseOptionsInput = {}): FarmModel {
	const built = buildFarmModel(plan, optimiseOptionsSchema.parse(options));
	if (!built.ok) throw new Error(JSON.stringify(built.issues));
	return built.farm;
}

// -0 and 0 are the same bound and cost; the file writes both as 0.
const plain = (n: number) => n + 0;
const sum = (values: number[]) => values.reduce((a, b) => a + b, 0);

/** Every whole-field plan of the farm, one rotation and phase per field (choices per field ^ fields). */
function everyWholeFieldPlan(plan: PlanDocument, farm: FarmModel) {
	const byField = plan.fields.map((_, i) => farm.choices.filter((c) => c.fieldIndex === i));
	let plans: { fieldId: string; rotationId: string; startingPhase: number }[][] = [[]];
	byField.forEach((choices, i) => {
		plans = plans.flatMap((partial) =>
			choices.map((c) => [
				...partial,
				{ fieldId: plan.fields[i].id, rotationId: c.rotationId, startingPhase: c.startingPhase }
			])
		);
	});
	return plans;
}

describe('the small farm, reasoned out by hand', () => {
	const plan = smallFarm();
	const farm = farmModel(plan);
	const herd = plan.herd!;
	const units = animalUnits(herd.head, herd.averageWeightLb);
	const auDaysPerBale =
		(herd.baleWeightLb * (herd.baleDryMatterPercent / 100) * (1 - herd.feedingWastePercent / 100)) /
		herd.intakeLbDmPerAuDay;
	const prices = farm.years.map((year) => planLookups(plan).pricesByYear.get(year)!);

	it('offers less grazing than the herd can eat, so each field’s choice stands on its own', () => {
		// The herd grazes at most units × grazing days in a year (forage ledger, feedingYear).
		const capacity = units * Math.min(herd.feedingSeasonDays, herd.maxGrazingDays ?? Infinity);
		const mostOffered = farm.years.map((_, y) =>
			sum(
				plan.fields.map((_, f) =>
					Math.max(
						...farm.choices.filter((c) => c.fieldIndex === f).map((c) => c.years[y].grazingAuDays)
					)
				)
			)
		);
		expect(Math.max(...mostOffered)).toBeGreaterThan(0);
		expect(Math.max(...mostOffered)).toBeLessThan(capacity);
		expect(farm.choices).toHaveLength(plan.fields.length * 4);
	});

	it('has the optimum each field’s best choice gives, and no whole-field plan beats it', async () => {
		// By hand: an AU-day grazed saves its share of a bale (bale × DM % × (1 − waste %) ÷ intake per
		// AU-day, the forage ledger's hay formula) and the chore hours of a grazing day over a hay day.
		const auDayValue = prices.map(
			(p) =>
				p.hayUsdPerBale / auDaysPerBale +
				((herd.choreHoursPerDayFeedingHay - herd.choreHoursPerDayGrazing) / units) *
					p.labourUsdPerHour
		);
		const choiceValue = (c: FarmModel['choices'][number]) =>
			farm.model.columns[c.column].cost +
			sum(c.years.map((y, i) => y.grazingAuDays * auDayValue[i]));
		const best = plan.fields.map((_, f) =>
			Math.max(...farm.choices.filter((c) => c.fieldIndex === f).map(choiceValue))
		);
		// What comes whatever is grown: fixed costs, a hay-fed season's chores and a hay-fed season's hay.
		const fixed = sum(
			prices.map(
				(p) =>
					-plan.farm.fixedCostsUsdPerYear -
					herd.feedingSeasonDays * herd.choreHoursPerDayFeedingHay * p.labourUsdPerHour -
					((units * herd.feedingSeasonDays) / auDaysPerBale) * p.hayUsdPerBale
			)
		);
		const byHand = fixed + sum(best);

		// The engine on every whole-field plan (4 choices ^ 3 fields = 64 plans): the best is the same.
		const plans = everyWholeFieldPlan(plan, farm);
		expect(plans).toHaveLength(64);
		const netReturns = plans.map((fieldRotations) =>
			sum(
				evaluatePlan(withFieldRotations(plan, fieldRotations)).farmYears.map((y) => y.netReturnUsd)
			)
		);
		expect(relativeDifference(Math.max(...netReturns), byHand)).toBeLessThan(1e-9);

		// Both outside solvers reach it: the continuous model (no field gains from a split here) and the
		// whole-field one.
		const jsLp = solveWithJsLp(farm.model).objective!;
		expect(relativeDifference(jsLp, byHand)).toBeLessThan(1e-6);
		const continuous = await glpsol(writeLpFile(farm.model));
		expect(continuous.status).toBe('optimal');
		expect(relativeDifference(continuous.objective, byHand)).toBeLessThan(1e-6);
		const whole = await glpsol(writeLpFile(farmModel(plan, { wholeFields: true }).model));
		expect(whole.status).toBe('optimal');
		expect(relativeDifference(whole.objective, byHand)).toBeLessThan(1e-6);
	});
});

describe('the LP file', () => {
	const plan = smallFarm();
	// A ranged crop row (least and most acres of corn) and a purchased-N row, to be written and read.
	const options: OptimiseOptionsInput = {
		limits: {
			nitrogenPurchasedLbPerYear: 9000,
			crops: [{ cropId: 'corn', minAcres: 10, maxAcres: 100 }]
		}
	};

	it.each([false, true])(
		'reads back as the model it was written from (whole fields: %s)',
		(whole) => {
			const { model } = farmModel(plan, { ...options, wholeFields: whole });
			const text = writeLpFile(model, ['A comment line']);
			const read = readLpFile(text);
			expect(read.sense).toBe('Maximize');

			// IBM CPLEX File Formats Reference, "White space and line length in LP file format": names at
			// most 255 characters, lines at most 560; names of letters, digits and !"#$%&(),.;?@_'{}~, not
			// starting with a digit or a period, and not e/E followed by a digit (exponent notation).
			expect(read.longestLine).toBeLessThanOrEqual(560);
			for (const name of [...read.columnOrder, ...read.rows.map((r) => r.name)]) {
				expect(name.length).toBeLessThanOrEqual(255);
				expect(name).toMatch(/^[A-Za-z!"#$%&(),;?@_'{}~][A-Za-z0-9!"#$%&(),.;?@_'{}~]*$/);
				expect(name).not.toMatch(/^[eE][0-9eE]/);
			}

			// Columns: every one of the model's, and the constant term's column, fixed at 1, carrying the
			// objective's constant as its cost.
			const names = model.columns.map((c) => c.name);
			expect(new Set(read.columnOrder)).toEqual(new Set([...names, 'constant_term']));
			expect(read.bounds.get('constant_term')).toEqual({ lower: 1, upper: 1 });
			expect(read.objective.get('constant_term')).toBe(model.offset);
			for (const column of model.columns) {
				expect(plain(read.objective.get(column.name) ?? 0)).toBe(plain(column.cost));
				// Without a bound line a column is 0 to +infinity (CPLEX LP format's default).
				expect(read.bounds.get(column.name) ?? { lower: 0, upper: Infinity }).toEqual({
					lower: column.lower,
					upper: column.upper
				});
			}
			const shares = names.filter((n) => n.startsWith('share_'));
			expect(shares).toHaveLength(12);
			for (const share of shares) expect(read.bounds.get(share)).toEqual({ lower: 0, upper: 1 });

			// Rows: a ranged row is written as `name.lo: … >= lower` and `name: … <= upper`.
			const rowsByName = new Map(read.rows.map((r) => [r.name, r]));
			let ranged = 0;
			for (const row of model.rows) {
				const terms = new Map(row.columns.map((j, k) => [names[j], row.values[k]]));
				const written = rowsByName.get(row.name)!;
				expect(written, row.name).toBeDefined();
				expect(written.terms).toEqual(terms);
				if (row.lower === row.upper)
					expect([written.sense, written.rhs]).toEqual(['=', plain(row.upper)]);
				else if (Number.isFinite(row.lower) && Number.isFinite(row.upper)) {
					ranged++;
					const lower = rowsByName.get(`${row.name}.lo`)!;
					expect([lower.sense, lower.rhs, lower.terms]).toEqual(['>=', plain(row.lower), terms]);
					expect([written.sense, written.rhs]).toEqual(['<=', plain(row.upper)]);
				} else if (Number.isFinite(row.upper)) {
					expect([written.sense, written.rhs]).toEqual(['<=', plain(row.upper)]);
				} else expect([written.sense, written.rhs]).toEqual(['>=', plain(row.lower)]);
			}
			expect(ranged).toBe(farmModel(plan, options).years.length);
			expect(read.rows).toHaveLength(model.rows.length + ranged);
			expect(rowsByName.has('nitrogen_2027')).toBe(true);

			// Generals: exactly the fields' shares when fields are taken whole, none otherwise.
			expect(read.generals).toEqual(whole ? shares : []);
		}
	);

	it('is solved by glpsol to the objective javascript-lp-solver finds on the same model', async () => {
		const plans: [string, PlanDocument][] = [
			['small farm', plan],
			...scenarioNames.map((name): [string, PlanDocument] => [name, scenarioPlan(name)]),
			['generated 14 × 4', generatedFarm(14, 4)]
		];
		let solved = 0;
		for (const [name, p] of plans) {
			for (const limits of [{}, options.limits]) {
				const { model } = farmModel(p, limits === options.limits ? options : {});
				const glpk = await glpsol(writeLpFile(model));
				const jsLp = solveWithJsLp(model);
				if (glpk.status === 'infeasible') {
					expect(jsLp.result.feasible, name).toBe(false);
					continue;
				}
				expect(glpk.status, `${name}\n${glpk.report}`).toBe('optimal');
				expect(relativeDifference(jsLp.objective!, glpk.objective), name).toBeLessThan(1e-6);
				solved++;
			}
		}
		// Every farm without limits, and some with the N and corn limits, have an optimum to compare.
		expect(solved).toBeGreaterThan(plans.length);
	});
});
