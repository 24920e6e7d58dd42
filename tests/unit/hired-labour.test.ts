// Hired help in the budgets: each month's work goes to the cheapest hands first (the family's hours at
// the labour rate, hired hours at their wage), and the wages replace the labour rate on the hours hired.
// Checked by hand and against an outside solver: with every field fixed to its rotation, the only choice
// left in the optimiser's LP is who works and what the herd eats, so GLPK 5.0 glpsol (Debian package
// glpk-utils) on its LP file must reach the net return the engine's budgets give.
import { describe, expect, it } from 'vitest';
import { evaluatePlan } from '../../src/lib/engine';
import { allocateLabour } from '../../src/lib/engine/labour';
import { buildFarmModel } from '../../src/lib/engine/optimiser/farm-model';
import { writeLpFile } from '../../src/lib/engine/optimiser/lp-format';
import { optimiseOptionsSchema } from '../../src/lib/schemas/optimise';
import { parsePlanDocument, type PlanDocument } from '../../src/lib/schemas/plan-file';
import { glpsol, relativeDifference, smallFarm } from '../support/optimiser';

const sum = (values: number[]) => values.reduce((a, b) => a + b, 0);
const month = (m: number, hours: number) =>
	Array.from({ length: 12 }, (_, i) => (i === m ? hours : 0));

describe('who works each month', () => {
	// By hand, October (month index 9) with 400 hours of work, labour rate $18/h, the family 250 h:
	// a hand at $15/h (60 h) is cheaper than the family and works first: 60 h; the family 250 h;
	// a hand at $24/h (100 h) the remaining 90 h. Wages 60 × 15 + 90 × 24 = $3,060.
	it('hires the cheaper hand before the family and the dearer one after', () => {
		const allocation = allocateLabour(
			month(9, 400),
			month(9, 250),
			[
				{ wageUsdPerHour: 24, hoursAvailableByMonth: month(9, 100) },
				{ wageUsdPerHour: 15, hoursAvailableByMonth: month(9, 60) }
			],
			18
		);
		expect(allocation.hiredHoursByMonth[9]).toBeCloseTo(150, 9);
		expect(allocation.hiredHours).toBeCloseTo(150, 9);
		expect(allocation.hiredWagesUsd).toBeCloseTo(3_060, 9);
	});

	// By hand: 100 h of work, the $15 hand takes 60 h, the family the other 40 h; nobody at $24.
	it('leaves the dearer hand idle while the family has hours', () => {
		const allocation = allocateLabour(
			month(9, 100),
			month(9, 250),
			[
				{ wageUsdPerHour: 24, hoursAvailableByMonth: month(9, 100) },
				{ wageUsdPerHour: 15, hoursAvailableByMonth: month(9, 60) }
			],
			18
		);
		expect(allocation.hiredHours).toBeCloseTo(60, 9);
		expect(allocation.hiredWagesUsd).toBeCloseTo(900, 9);
	});

	// At a wage equal to the labour rate the family works first (nothing to gain by hiring).
	it('gives the family the work at equal cost, and leaves a shortfall past everyone’s hours', () => {
		const equal = allocateLabour(
			month(3, 100),
			month(3, 80),
			[{ wageUsdPerHour: 18, hoursAvailableByMonth: month(3, 10) }],
			18
		);
		// 80 family hours, 10 hired, 10 hours nobody has
		expect(equal.hiredHours).toBeCloseTo(10, 9);
	});
});

/** The plan's farm worked by one operator with a share of its hours, a $`wages[0]` hand (5 h a month) and a
 * $`wages[1]` crew with all the hours needed. */
function withPeople(
	plan: PlanDocument,
	familyShare: number,
	wages: [number, number],
	herd: PlanDocument['herd'] = plan.herd
) {
	const family = plan.farm.labourHoursAvailableByMonth.map((h) => Math.round(h * familyShare));
	const parsed = parsePlanDocument({
		...plan,
		farm: { ...plan.farm, labourHoursAvailableByMonth: family },
		herd,
		people: [
			{ id: 'op', name: 'Operator', role: 'operator', hoursAvailableByMonth: family },
			{
				id: 'hand',
				name: 'Neighbour’s son',
				role: 'hired',
				hoursAvailableByMonth: Array(12).fill(5),
				wageUsdPerHour: wages[0]
			},
			{
				id: 'crew',
				name: 'Custom crew',
				role: 'hired',
				hoursAvailableByMonth: Array(12).fill(744),
				wageUsdPerHour: wages[1]
			}
		]
	});
	if (!parsed.ok) throw new Error(JSON.stringify(parsed.issues));
	return parsed.plan;
}

describe('hired help in the budgets', () => {
	it('changes net return by exactly the wages less the labour rate on the hired hours', () => {
		const plan = smallFarm();
		const nobodyHired = evaluatePlan(withPeople(plan, 0.03, [18, 18]));
		const hired = evaluatePlan(withPeople(plan, 0.03, [12, 30]));
		hired.farmYears.forEach((year, y) => {
			const rate = 18; // the small farm's price sets: $18/h every year
			// At wages equal to the rate the budgets are as if every hour were charged at the rate.
			expect(nobodyHired.farmYears[y].hiredWageAdjustmentUsd).toBeCloseTo(0, 6);
			expect(year.hiredLabourHours).toBeGreaterThan(0);
			expect(year.hiredWageAdjustmentUsd).toBeCloseTo(
				year.hiredLabourUsd - year.hiredLabourHours * rate,
				6
			);
			expect(nobodyHired.farmYears[y].netReturnUsd - year.netReturnUsd).toBeCloseTo(
				year.hiredWageAdjustmentUsd,
				6
			);
			expect(sum(year.hiredLabourHoursByMonth)).toBeCloseTo(year.hiredLabourHours, 9);
		});
	});

	it('shows the wages as a whole-farm cost line in a partial budget', () => {
		const plan = smallFarm();
		const before = withPeople(plan, 0.03, [18, 18]);
		const after = withPeople(plan, 0.03, [18, 30]);
		const budget = evaluatePlan(after, before).partialBudget!;
		const line = budget.years[0].lines.addedCosts.find((l) => l.category === 'hired-labour');
		const year = evaluatePlan(after).farmYears[0];
		expect(line?.enterprise).toBe('farm');
		expect(line?.amountUsd).toBeCloseTo(year.hiredWageAdjustmentUsd, 6);
	});

	// Without a herd: the model knows how many days are grazed but not in which months (docs/optimiser.md),
	// so chores by month, and the hands that do them, could differ from the budgets'.
	it('gives the net return glpsol finds when the LP may choose who works', async () => {
		for (const wages of [
			[12, 30],
			[25, 30]
		] as [number, number][]) {
			const plan = withPeople(smallFarm(), 0.005, wages, null);
			const options = optimiseOptionsSchema.parse({
				limits: {
					fixedFields: plan.plan.fieldRotations.map((a) => ({
						fieldId: a.fieldId,
						rotationId: a.rotationId,
						startingPhase: a.startingPhase
					}))
				}
			});
			const built = buildFarmModel(plan, options);
			if (!built.ok) throw new Error(JSON.stringify(built.issues));
			const answer = await glpsol(writeLpFile(built.farm.model));
			expect(answer.status).toBe('optimal');
			const farmYears = evaluatePlan(plan).farmYears;
			// the crew works too: some month needs more than the hand's 5 hours and the family's
			expect(Math.max(...farmYears.flatMap((y) => y.hiredLabourHoursByMonth))).toBeGreaterThan(5);
			const engine = sum(farmYears.map((y) => y.netReturnUsd));
			expect(relativeDifference(answer.objective, engine)).toBeLessThan(1e-6);
		}
	});
});
