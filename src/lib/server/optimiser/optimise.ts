// The optimiser as the API, the optimiser page and the command line call it: the farm model built by
// the engine, solved by HiGHS in its worker, the answer put in the farm's terms. Relative imports: the
// command line runs this under tsx, without the app's aliases.
import { currentPlanYears } from '../../engine/optimiser/current-plan';
import { buildFarmModel, type FarmModel } from '../../engine/optimiser/farm-model';
import { interpretAnswer, type SolverAnswer } from '../../engine/optimiser/interpret';
import { toCsr } from '../../engine/optimiser/linear-model';
import { writeLpFile } from '../../engine/optimiser/lp-format';
import type { OptimiseResult, OptimisedYear, TradeOffLine } from '../../engine/optimiser/types';
import type { FieldIssue } from '../../schemas/issues';
import type { OptimiseOptions, TradeOffRequest } from '../../schemas/optimise';
import type { PlanDocument } from '../../schemas/plan-file';
import { solveWithHighs, sweepWithHighs } from './highs';

export type Optimised =
	{ ok: true; result: OptimiseResult; farm: FarmModel } | { ok: false; issues: FieldIssue[] };

/** A solver that fails or stops answering gives an answer saying so, never an error page. */
function failedAnswer(error: unknown): SolverAnswer {
	return {
		status: 'error',
		message: `The solver failed: ${error instanceof Error ? error.message : String(error)}`,
		objective: null,
		columnValues: null,
		rowValues: null,
		rowMarginalValues: null,
		bestBound: null,
		gapPercent: null,
		conflictRows: [],
		conflictColumns: [],
		solveMs: 0
	};
}

export async function optimisePlan(
	plan: PlanDocument,
	options: OptimiseOptions
): Promise<Optimised> {
	const built = buildFarmModel(plan, options);
	if (!built.ok) return built;
	const answer = await solveWithHighs(toCsr(built.farm.model), options).catch(failedAnswer);
	return { ok: true, result: interpretAnswer(built.farm, answer), farm: built.farm };
}

/** The farm model as a CPLEX LP file, for an advisor to solve with a solver of their own. */
export function optimiserLpFile(
	plan: PlanDocument,
	options: OptimiseOptions
): { ok: true; text: string } | { ok: false; issues: FieldIssue[] } {
	const built = buildFarmModel(plan, options);
	if (!built.ok) return built;
	return {
		ok: true,
		text: writeLpFile(built.farm.model, [
			`Plan "${plan.plan.name}", ${plan.plan.horizon.years} years from ${plan.plan.horizon.startYear}.`,
			'Maximise: net return over the plan years (dollars), with the weights the optimiser was given.',
			'share_<field>_<rotation>_p<phase>: share of the field under the rotation from that phase (0 to 1).'
		])
	};
}

/** The plan as it stands: its years and net return, to set beside an optimised mix. */
export function currentPlan(plan: PlanDocument): { netReturnUsd: number; years: OptimisedYear[] } {
	const years = currentPlanYears(plan);
	return { netReturnUsd: years.reduce((sum, y) => sum + y.netReturnUsd, 0), years };
}

const sweepSeconds = 120;

/** The swept limit's value for a year of the plan as it stands (family hours in the months, or N). */
function sweptValue(request: TradeOffRequest, year: OptimisedYear): number {
	if (request.sweep.limit === 'nitrogen') return year.nitrogenPurchasedLb;
	const months = new Set(request.sweep.months!.map((m) => m - 1));
	return year.familyLabourHoursByMonth.reduce((sum, h, m) => sum + (months.has(m) ? h : 0), 0);
}

/**
 * A trade-off curve: the limit swept from `from` to `to`, each point solved in turn on one model.
 * Options that do not fit the plan are refused at once; otherwise `run` solves, and `send` hears
 * progress, each point, then where the plan as it stands falls.
 */
export function tradeOffCurve(
	plan: PlanDocument,
	request: TradeOffRequest
):
	| { ok: true; run: (send: (line: TradeOffLine) => void) => Promise<void> }
	| { ok: false; issues: FieldIssue[] } {
	const { sweep } = request;
	const options: OptimiseOptions = {
		...request.options,
		// The whole curve within two minutes, however many points.
		timeLimitSeconds: Math.min(request.options.timeLimitSeconds, sweepSeconds / sweep.points),
		limits:
			sweep.limit === 'nitrogen'
				? { ...request.options.limits, nitrogenPurchasedLbPerYear: sweep.to }
				: {
						...request.options.limits,
						familyLabourSpan: { months: sweep.months!, maxHours: sweep.to }
					}
	};
	const built = buildFarmModel(plan, options);
	if (!built.ok) return built;
	const { farm } = built;
	const kind = sweep.limit === 'nitrogen' ? 'nitrogen' : 'family-span';
	const rows = farm.rowRoles.flatMap((role, i) => (role.kind === kind ? [i] : []));
	// A row's upper bound is its limit less what the model moved to the right-hand side (chores).
	const offsets = rows.map((i) => farm.rowLimits[i] - farm.model.rows[i].upper);
	// Each point is read with the swept rows at that point's limit, as it was solved.
	const swept = new Set(rows);
	const atLimit = (limit: number): FarmModel => ({
		...farm,
		rowLimits: farm.rowLimits.map((l, i) => (swept.has(i) ? limit : l)),
		model: {
			...farm.model,
			rows: farm.model.rows.map((row, i) =>
				swept.has(i) ? { ...row, upper: limit - (farm.rowLimits[i] - row.upper) } : row
			)
		}
	});
	const limits = Array.from(
		{ length: sweep.points },
		(_, k) => sweep.from + ((sweep.to - sweep.from) * k) / (sweep.points - 1)
	);
	const run = async (send: (line: TradeOffLine) => void) => {
		send({ type: 'progress', done: 0, total: limits.length });
		let done = 0;
		await sweepWithHighs(
			toCsr(farm.model),
			rows,
			limits.map((limit) => offsets.map((offset) => limit - offset)),
			options,
			(index, answer) => {
				send({
					type: 'point',
					index,
					point: { limit: limits[index], result: interpretAnswer(atLimit(limits[index]), answer) }
				});
				send({ type: 'progress', done: ++done, total: limits.length });
			}
		);
		const current = currentPlan(plan);
		send({
			type: 'done',
			current: {
				limit: Math.max(...current.years.map((y) => sweptValue(request, y))),
				netReturnUsd: current.netReturnUsd
			}
		});
	};
	return { ok: true, run };
}
