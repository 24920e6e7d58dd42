/**
 * The code of the worker thread that runs HiGHS. HiGHS (compiled to WebAssembly) is synchronous and a
 * whole-field solve can take seconds, so it never runs on a thread that answers requests. The worker is
 * started from this text (`eval`) rather than from a file, so the app's build, the CLI and the tests
 * start it the same way; it loads HiGHS once and answers one job at a time, disposing of each model.
 *
 * Jobs and answers (all plain data; arrays as typed arrays):
 *   { id, kind: 'solve', model, timeLimitSeconds, gapPercent }            → { id, kind: 'answer', answer }
 *   { id, kind: 'sweep', model, rows, uppers, timeLimitSeconds, gapPercent }
 *       → { id, kind: 'point', index, answer } for each point, then { id, kind: 'done' }
 * `model` is the CSR form of `toCsr`; a sweep sets `rows`' upper bounds to each point's `uppers[k]` on
 * one persistent model, so each point starts from the last point's basis.
 */
export const highsWorkerSource = String.raw`
const { parentPort, workerData } = require('node:worker_threads');
const loading = require(workerData.highsPath)();

const statusByCode = new Map([
	[7, 'optimal'],
	[8, 'infeasible'],
	[9, 'infeasible'],
	[10, 'unbounded'],
	[13, 'time-limit']
]);

function modelData(highs, m, { relaxed = false, fixed = null } = {}) {
	return {
		numCols: m.numCols,
		numRows: m.numRows,
		sense: highs.constants.objectiveSense.maximize,
		offset: m.offset,
		colCost: m.colCost,
		colLower: fixed ? fixed.lower : m.colLower,
		colUpper: fixed ? fixed.upper : m.colUpper,
		rowLower: m.rowLower,
		rowUpper: m.rowUpper,
		matrix: {
			format: 'csr',
			numRows: m.numRows,
			numCols: m.numCols,
			starts: m.starts,
			indices: m.indices,
			values: m.values
		},
		...(m.integrality && !relaxed ? { integrality: m.integrality } : {})
	};
}

function setOptions(model, job) {
	model.options.set({
		output_flag: false,
		time_limit: job.timeLimitSeconds,
		mip_rel_gap: job.gapPercent / 100,
		// Presolve took 4.5 s of an 8.5 s LP solve at 2000 fields and removed almost nothing (HiGHS
		// 1.15.3's log), most of it in its parallel rows and columns rule: the LP goes without it, a
		// whole-field model keeps the rest of presolve, which its branching gains from.
		...(job.model.integrality ? { presolve_rule_off: 8192 } : { presolve: 'off' }),
		iis_strategy: 6
	});
}

/** Row duals of the LP with every integer column held at its whole-field value. */
function heldDuals(highs, m, colValue, job) {
	const lower = Float64Array.from(m.colLower);
	const upper = Float64Array.from(m.colUpper);
	for (let j = 0; j < m.numCols; j++) {
		if (m.integrality[j]) lower[j] = upper[j] = Math.round(colValue[j]);
	}
	const lp = highs.createModel(modelData(highs, m, { relaxed: true, fixed: { lower, upper } }));
	try {
		setOptions(lp, job);
		lp.run();
		return lp.getModelStatus() === 7 ? Float64Array.from(lp.getSolution().rowDual) : null;
	} finally {
		lp.dispose();
	}
}

/** The rows and columns of an irreducible set of limits that cannot all hold, on the LP. */
function conflict(highs, m, job) {
	const lp = highs.createModel(modelData(highs, m, { relaxed: true }));
	try {
		setOptions(lp, job);
		lp.run();
		if (lp.getModelStatus() !== 8) return { rows: [], columns: [], relaxedFeasible: true };
		const iis = lp.getIis();
		return { rows: Array.from(iis.rowIndex), columns: Array.from(iis.colIndex), relaxedFeasible: false };
	} finally {
		lp.dispose();
	}
}

function answerOf(highs, model, m, job, started) {
	const code = model.getModelStatus();
	const isMip = m.integrality !== null;
	let status = statusByCode.get(code) ?? 'error';
	const hasSolution = Number(model.info.get('primal_solution_status')) === 2;
	if (status === 'time-limit' && !hasSolution) status = 'error';
	const answer = {
		status,
		message: status === 'error' ? 'HiGHS stopped with model status ' + code + '.' : '',
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
	if (status === 'optimal' || status === 'time-limit') {
		const solution = model.getSolution();
		answer.objective = model.getObjectiveValue();
		answer.columnValues = Float64Array.from(solution.colValue);
		answer.rowValues = Float64Array.from(solution.rowValue);
		if (isMip) {
			answer.bestBound = Number(model.info.get('mip_dual_bound'));
			answer.gapPercent = Math.max(0, Number(model.info.get('mip_gap')) * 100);
			answer.rowMarginalValues = heldDuals(highs, m, solution.colValue, job);
		} else {
			answer.rowMarginalValues = Float64Array.from(solution.rowDual);
		}
	}
	if (status === 'infeasible') {
		const found = conflict(highs, m, job);
		answer.conflictRows = found.rows;
		answer.conflictColumns = found.columns;
		if (found.relaxedFeasible) {
			answer.message =
				'No choice of whole fields keeps every limit, though splitting fields would: clear "whole fields", or relax a limit.';
		}
	}
	answer.solveMs = performance.now() - started;
	return answer;
}

function solve(highs, job) {
	const started = performance.now();
	const model = highs.createModel(modelData(highs, job.model));
	try {
		setOptions(model, job);
		model.run();
		return answerOf(highs, model, job.model, job, started);
	} finally {
		model.dispose();
	}
}

function sweep(highs, job) {
	const model = highs.createModel(modelData(highs, job.model));
	try {
		setOptions(model, job);
		job.uppers.forEach((uppers, index) => {
			const started = performance.now();
			const m = { ...job.model, rowUpper: Float64Array.from(job.model.rowUpper) };
			job.rows.forEach((row, r) => {
				model.changeRowBounds(row, m.rowLower[row], uppers[r]);
				m.rowUpper[row] = uppers[r];
			});
			model.run();
			const answer = answerOf(highs, model, m, job, started);
			parentPort.postMessage({ id: job.id, kind: 'point', index, answer });
		});
	} finally {
		model.dispose();
	}
}

parentPort.on('message', async (job) => {
	try {
		const highs = await loading;
		if (job.kind === 'solve') parentPort.postMessage({ id: job.id, kind: 'answer', answer: solve(highs, job) });
		else sweep(highs, job);
		if (job.kind === 'sweep') parentPort.postMessage({ id: job.id, kind: 'done' });
	} catch (error) {
		parentPort.postMessage({ id: job.id, kind: 'failed', message: String(error && error.message || error) });
	}
});
`;
