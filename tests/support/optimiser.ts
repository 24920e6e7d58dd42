// Outside solvers and readers for the optimiser's tests: GLPK's glpsol on the LP file the optimiser
// writes, javascript-lp-solver on the same model converted to its JSON form, a reader of the CPLEX LP
// format (as GLPK's `glpsol --lp` documents it) to read the file back, and small farms to reason about.
import { execFile } from 'node:child_process';
import { mkdtemp, readFile, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { promisify } from 'node:util';
import solver, { type Model as JsLpModel, type SolveResult } from 'javascript-lp-solver';
import type { LinearModel } from '../../src/lib/engine/optimiser/linear-model';
import { parsePlanDocument, type PlanDocument } from '../../src/lib/schemas/plan-file';
import { readFileSync } from 'node:fs';

const run = promisify(execFile);

export interface GlpsolAnswer {
	/** 'optimal', or 'infeasible' when glpsol reports no (integer) feasible solution. */
	status: 'optimal' | 'infeasible' | 'other';
	/** The objective from the `s` line of `glpsol -w` (printed with 15 significant digits). */
	objective: number;
	/** glpsol's printed report (stdout). */
	report: string;
}

/**
 * GLPK 5.0 glpsol (Debian package glpk-utils) on an LP file: `glpsol --lp file -w solution`. Its
 * solution file's `s` line is `s bas ROWS COLS PRIM DUAL OBJ` for an LP (f f: optimal) and
 * `s mip ROWS COLS STATUS OBJ` for a MIP (o: optimal), per the GLPK reference manual's "glp_write_sol".
 * Runs asynchronously: never blocks the test process's event loop.
 */
export async function glpsol(lpText: string, { relaxed = false } = {}): Promise<GlpsolAnswer> {
	const dir = await mkdtemp(join(tmpdir(), 'glpsol-'));
	try {
		const lpFile = join(dir, 'model.lp');
		const solutionFile = join(dir, 'solution.txt');
		await writeFile(lpFile, lpText);
		const args = ['--lp', lpFile, '-w', solutionFile, ...(relaxed ? ['--nomip'] : [])];
		const { stdout } = await run('glpsol', args, { maxBuffer: 64 * 1024 * 1024 });
		const solution = await readFile(solutionFile, 'utf8');
		const s = solution.split('\n').find((line) => line.startsWith('s '));
		if (!s) throw new Error(`glpsol wrote no status line:\n${stdout}`);
		const parts = s.trim().split(/\s+/);
		const objective = Number(parts[parts.length - 1]);
		const optimal = parts[1] === 'mip' ? parts[4] === 'o' : parts[4] === 'f' && parts[5] === 'f';
		const infeasible = /NO (PRIMAL|INTEGER) FEASIBLE SOLUTION/.test(stdout) || parts[4] === 'n';
		return {
			status: optimal ? 'optimal' : infeasible ? 'infeasible' : 'other',
			objective,
			report: stdout
		};
	} finally {
		await rm(dir, { recursive: true, force: true });
	}
}

/**
 * The model in javascript-lp-solver's JSON form (its README: `optimize`, `opType`, `constraints`,
 * `variables`): each column a variable (non-negative unless marked unrestricted), its bounds as rows of
 * their own, integrality dropped (the continuous model).
 */
export function toJsLpModel(model: LinearModel): JsLpModel {
	const constraints: JsLpModel['constraints'] = {};
	const variables: JsLpModel['variables'] = {};
	const unrestricted: Record<string, boolean> = {};
	model.columns.forEach((column) => {
		const variable: Record<string, number> = { objective: column.cost };
		if (column.upper !== Infinity) {
			constraints[`ub:${column.name}`] = { max: column.upper };
			variable[`ub:${column.name}`] = 1;
		}
		if (column.lower === -Infinity) unrestricted[column.name] = true;
		else if (column.lower !== 0) {
			constraints[`lb:${column.name}`] = { min: column.lower };
			variable[`lb:${column.name}`] = 1;
		}
		variables[column.name] = variable;
	});
	model.rows.forEach((row) => {
		const key = `row:${row.name}`;
		if (row.lower === row.upper) constraints[key] = { equal: row.upper };
		else {
			constraints[key] = {
				...(Number.isFinite(row.lower) ? { min: row.lower } : {}),
				...(Number.isFinite(row.upper) ? { max: row.upper } : {})
			};
		}
		row.columns.forEach((j, k) => (variables[model.columns[j].name][key] = row.values[k]));
	});
	return { optimize: 'objective', opType: 'max', constraints, variables, unrestricted };
}

/** javascript-lp-solver's optimum of the continuous model, constant term added (null: infeasible). */
export function solveWithJsLp(model: LinearModel): {
	objective: number | null;
	result: SolveResult;
} {
	const answer = solver.Solve(toJsLpModel(model));
	if (!answer || typeof answer !== 'object' || !('feasible' in answer)) {
		throw new Error('javascript-lp-solver gave no answer');
	}
	const result = answer as SolveResult;
	return { objective: result.feasible ? result.result + model.offset : null, result };
}

/** A CPLEX LP file read back: what the objective, rows, bounds and Generals say. */
export interface ReadLpFile {
	sense: string;
	objective: Map<string, number>;
	rows: { name: string; terms: Map<string, number>; sense: '<=' | '>=' | '='; rhs: number }[];
	bounds: Map<string, { lower: number; upper: number }>;
	generals: string[];
	/** Columns in order of first appearance (objective, rows, bounds), as GLPK numbers them. */
	columnOrder: string[];
	longestLine: number;
}

function readTerms(text: string, seen: (name: string) => void): Map<string, number> {
	const terms = new Map<string, number>();
	const tokens = text.trim().split(/\s+/).filter(Boolean);
	for (let i = 0; i < tokens.length;) {
		let sign = 1;
		if (tokens[i] === '+' || tokens[i] === '-') sign = tokens[i++] === '-' ? -1 : 1;
		let coefficient = 1;
		if (/^[0-9.]/.test(tokens[i])) coefficient = Number(tokens[i++]);
		const name = tokens[i++];
		seen(name);
		terms.set(name, (terms.get(name) ?? 0) + sign * coefficient);
	}
	return terms;
}

const boundValue = (text: string) =>
	/^[+-]?inf(inity)?$/i.test(text) ? (text.startsWith('-') ? -Infinity : Infinity) : Number(text);

/**
 * Reads the subset of the CPLEX LP format the optimiser writes (GLPK reference manual, appendix "CPLEX
 * LP format": sections, `name: terms op rhs` rows continued on indented lines, `l <= x <= u`, `x = v`,
 * `x >= l`, `x free` bounds, Generals), strictly enough that anything else fails the test.
 */
export function readLpFile(text: string): ReadLpFile {
	const lines = text.split('\n');
	const longestLine = Math.max(...lines.map((l) => l.length));
	const statements: { section: string; text: string }[] = [];
	let section = '';
	for (const line of lines) {
		if (line.startsWith('\\') || line.trim() === '') continue;
		const keyword = line.trim().toLowerCase();
		if (['maximize', 'minimize', 'subject to', 'bounds', 'generals', 'end'].includes(keyword)) {
			section = keyword;
			continue;
		}
		// A statement starts with one space; its continuation lines with more.
		if (/^ \S/.test(line) || section === 'generals') statements.push({ section, text: line });
		else if (statements.length) statements[statements.length - 1].text += ' ' + line;
		else throw new Error(`LP file: text before any section: ${line}`);
	}
	const sense = lines.find((l) => /^(maximize|minimize)$/i.test(l.trim()))?.trim() ?? '';
	const columnOrder: string[] = [];
	const known = new Set<string>();
	const seen = (name: string) => {
		if (!known.has(name)) columnOrder.push(name);
		known.add(name);
	};
	const result: ReadLpFile = {
		sense,
		objective: new Map(),
		rows: [],
		bounds: new Map(),
		generals: [],
		columnOrder,
		longestLine
	};
	for (const { section: where, text: statement } of statements) {
		if (where === 'maximize' || where === 'minimize') {
			const [, terms] = statement.match(/^\s*\w+:(.*)$/) ?? [];
			if (terms === undefined) throw new Error(`LP file: objective without a name: ${statement}`);
			result.objective = readTerms(terms, seen);
		} else if (where === 'subject to') {
			const match = statement.match(/^\s*([\w.]+):(.*?)(<=|>=|=)\s*(\S+)\s*$/);
			if (!match) throw new Error(`LP file: cannot read row: ${statement}`);
			const [, name, terms, op, rhs] = match;
			result.rows.push({
				name,
				terms: readTerms(terms, seen),
				sense: op as '<=' | '>=' | '=',
				rhs: Number(rhs)
			});
		} else if (where === 'bounds') {
			const t = statement.trim().split(/\s+/);
			let bound: { name: string; lower: number; upper: number };
			if (t.length === 5 && t[1] === '<=' && t[3] === '<=') {
				bound = { name: t[2], lower: boundValue(t[0]), upper: boundValue(t[4]) };
			} else if (t.length === 3 && t[1] === '=') {
				bound = { name: t[0], lower: Number(t[2]), upper: Number(t[2]) };
			} else if (t.length === 3 && t[1] === '>=') {
				bound = { name: t[0], lower: boundValue(t[2]), upper: Infinity };
			} else if (t.length === 2 && t[1] === 'free') {
				bound = { name: t[0], lower: -Infinity, upper: Infinity };
			} else throw new Error(`LP file: cannot read bound: ${statement}`);
			seen(bound.name);
			result.bounds.set(bound.name, { lower: bound.lower, upper: bound.upper });
		} else if (where === 'generals') {
			result.generals.push(...statement.trim().split(/\s+/));
		} else throw new Error(`LP file: statement outside a section: ${statement}`);
	}
	return result;
}

/** Relative difference, for comparing objectives of very different sizes. */
export function relativeDifference(a: number, b: number): number {
	return Math.abs(a - b) / Math.max(1, Math.abs(a), Math.abs(b));
}

export const scenarioNames = ['reference', 'reduced-n', 'small-grain-peas', 'wide-row-interseeded'];

export function scenarioPlan(name: string): PlanDocument {
	const parsed = parsePlanDocument(JSON.parse(readFileSync(`scenarios/${name}.json`, 'utf8')));
	if (!parsed.ok) throw new Error(`${name}: ${JSON.stringify(parsed.issues)}`);
	return parsed.plan;
}

/**
 * A small farm to reason about by hand: scenarios/wide-row-interseeded.json cut to its first three
 * fields, with the reference plan's corn–soybean added beside its wide-row corn–soybean, and a herd
 * of `herdHead` head. With 10 head the herd can eat far more than three fields offer (75 grazing days
 * × 10.5 AU ≈ 790 AU-days), so all offered forage is eaten and each field's choice is worth the same
 * whatever the others choose: the optimum is each field's best choice.
 */
export function smallFarm({ herdHead = 200, fields = 3 } = {}): PlanDocument {
	const wide = JSON.parse(readFileSync('scenarios/wide-row-interseeded.json', 'utf8'));
	const reference = JSON.parse(readFileSync('scenarios/reference.json', 'utf8'));
	const practices = new Map<string, unknown>();
	for (const p of [...reference.practices, ...wide.practices]) practices.set(p.id, p);
	const operations = new Map<string, unknown>();
	for (const o of [...reference.operations, ...wide.operations]) operations.set(o.id, o);
	const keep = wide.fields.slice(0, fields);
	const keptIds = new Set(keep.map((f: { id: string }) => f.id));
	const document = {
		...wide,
		// Fixed costs in proportion to the 116 acres kept, not the whole demo farm's 480.
		farm: { ...wide.farm, fixedCostsUsdPerYear: 27_000 },
		fields: keep,
		herd: { ...wide.herd, head: herdHead },
		operations: [...operations.values()],
		practices: [...practices.values()],
		rotations: [...reference.rotations, ...wide.rotations],
		plan: {
			...wide.plan,
			name: 'Small farm: three fields, two rotations',
			fieldRotations: wide.plan.fieldRotations.filter((a: { fieldId: string }) =>
				keptIds.has(a.fieldId)
			),
			adjustments: (wide.plan.adjustments ?? []).filter((a: { fieldId: string }) =>
				keptIds.has(a.fieldId)
			)
		}
	};
	const parsed = parsePlanDocument(document);
	if (!parsed.ok) throw new Error(JSON.stringify(parsed.issues.slice(0, 5)));
	return parsed.plan;
}

/** The plan with each field on the rotation and phase chosen for it. */
export function withFieldRotations(
	plan: PlanDocument,
	choices: { fieldId: string; rotationId: string; startingPhase: number }[]
): PlanDocument {
	return { ...plan, plan: { ...plan.plan, fieldRotations: choices } };
}
