import type { LinearModel } from './linear-model';

/**
 * The model in CPLEX LP format, which GLPK (`glpsol --lp`), HiGHS, CBC and most other solvers read, so
 * an advisor can check an answer in a solver of their own. The objective's constant term is written as
 * the cost of a column fixed at 1 (`constant_term`), because not every reader takes a bare constant.
 */

// Terms per line: LP readers limit line length (GLPK's reader to a few hundred characters).
const termsPerLine = 6;
const constantColumn = 'constant_term';

/** Shortest text that reads back as the same double. */
function number(n: number): string {
	return String(n);
}

function terms(columns: number[], values: number[], names: string[]): string {
	const parts = columns.map((column, i) => {
		const value = values[i];
		const sign = value < 0 ? '-' : '+';
		return `${sign} ${number(Math.abs(value))} ${names[column]}`;
	});
	const lines: string[] = [];
	for (let i = 0; i < parts.length; i += termsPerLine) {
		lines.push(parts.slice(i, i + termsPerLine).join(' '));
	}
	return lines.join('\n   ');
}

export function writeLpFile(model: LinearModel, comments: string[] = []): string {
	const names = model.columns.map((c) => c.name);
	const withConstant = [...names, constantColumn];
	const out: string[] = [`\\ ${model.name}`, ...comments.map((c) => `\\ ${c}`), 'Maximize'];

	const objectiveColumns: number[] = [];
	const objectiveValues: number[] = [];
	model.columns.forEach((column, j) => {
		if (column.cost === 0) return;
		objectiveColumns.push(j);
		objectiveValues.push(column.cost);
	});
	if (model.offset !== 0) {
		objectiveColumns.push(names.length);
		objectiveValues.push(model.offset);
	}
	out.push(
		` obj: ${terms(objectiveColumns, objectiveValues, withConstant) || `0 ${constantColumn}`}`
	);

	out.push('Subject To');
	for (const row of model.rows) {
		// A row with no terms still holds (or fails) on its bounds: write it on the fixed column.
		const lhs = row.columns.length
			? terms(row.columns, row.values, withConstant)
			: `0 ${constantColumn}`;
		if (row.lower === row.upper) {
			out.push(` ${row.name}: ${lhs} = ${number(row.upper)}`);
			continue;
		}
		if (Number.isFinite(row.lower) && Number.isFinite(row.upper)) {
			out.push(` ${row.name}.lo: ${lhs} >= ${number(row.lower)}`);
			out.push(` ${row.name}: ${lhs} <= ${number(row.upper)}`);
		} else if (Number.isFinite(row.upper)) {
			out.push(` ${row.name}: ${lhs} <= ${number(row.upper)}`);
		} else if (Number.isFinite(row.lower)) {
			out.push(` ${row.name}: ${lhs} >= ${number(row.lower)}`);
		}
	}

	out.push('Bounds');
	for (const column of model.columns) {
		const { name, lower, upper } = column;
		if (lower === upper) out.push(` ${name} = ${number(lower)}`);
		else if (lower === -Infinity && upper === Infinity) out.push(` ${name} free`);
		else if (upper === Infinity) {
			if (lower !== 0) out.push(` ${name} >= ${number(lower)}`);
		} else if (lower === -Infinity) out.push(` -inf <= ${name} <= ${number(upper)}`);
		else out.push(` ${number(lower)} <= ${name} <= ${number(upper)}`);
	}
	out.push(` ${constantColumn} = 1`);

	const integers = model.columns.filter((c) => c.integer).map((c) => c.name);
	if (integers.length) {
		out.push('Generals');
		for (let i = 0; i < integers.length; i += termsPerLine) {
			out.push(` ${integers.slice(i, i + termsPerLine).join(' ')}`);
		}
	}
	out.push('End', '');
	return out.join('\n');
}
