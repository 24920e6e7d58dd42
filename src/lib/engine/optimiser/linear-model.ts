/**
 * A linear (or mixed-integer) programme in a solver-neutral form: named columns with bounds and
 * objective costs, named rows with bounds and sparse coefficients, a constant term. The farm model is
 * built in this form; HiGHS takes it as CSR arrays and the LP file writer writes it out.
 */

export interface Column {
	name: string;
	/** Objective coefficient (dollars per unit of the column). */
	cost: number;
	lower: number;
	upper: number;
	integer: boolean;
}

export interface Row {
	name: string;
	/** -Infinity when the row has no lower bound. */
	lower: number;
	/** Infinity when the row has no upper bound. */
	upper: number;
	columns: number[];
	values: number[];
}

export interface LinearModel {
	name: string;
	/** Always maximised: the farm model's objective is money earned. */
	sense: 'maximise';
	/** The constant term of the objective (fixed costs, chores that happen whatever is grown). */
	offset: number;
	columns: Column[];
	rows: Row[];
}

/** A row's coefficients as they are gathered: column, value; zeros are left out. */
export class RowEntries {
	readonly columns: number[] = [];
	readonly values: number[] = [];

	add(column: number, value: number): this {
		if (value !== 0) {
			this.columns.push(column);
			this.values.push(value);
		}
		return this;
	}

	/** Adds each item's column with `value(item)`. */
	append<T extends { column: number }>(items: T[], value: (item: T) => number): this {
		for (const item of items) this.add(item.column, value(item));
		return this;
	}

	/** The same row with each column once (values on a repeated column summed). */
	merged(): { columns: number[]; values: number[] } {
		if (new Set(this.columns).size === this.columns.length) return this;
		const byColumn = new Map<number, number>();
		this.columns.forEach((c, i) => byColumn.set(c, (byColumn.get(c) ?? 0) + this.values[i]));
		const merged = new RowEntries();
		for (const [column, value] of byColumn) merged.add(column, value);
		return merged;
	}
}

export class ModelBuilder {
	readonly columns: Column[] = [];
	readonly rows: Row[] = [];
	offset = 0;
	private readonly names = new Set<string>();

	constructor(readonly name: string) {}

	private claim(name: string) {
		if (this.names.has(name)) throw new Error(`The model already has a row or column ${name}`);
		this.names.add(name);
	}

	addColumn(column: Column): number {
		this.claim(column.name);
		this.columns.push(column);
		return this.columns.length - 1;
	}

	/** Adds a row; entries on the same column are summed and zero coefficients dropped. */
	addRow(name: string, lower: number, upper: number, entries: RowEntries): number {
		this.claim(name);
		const { columns, values } = entries.merged();
		this.rows.push({ name, lower, upper, columns, values });
		return this.rows.length - 1;
	}

	build(): LinearModel {
		return {
			name: this.name,
			sense: 'maximise',
			offset: this.offset,
			columns: this.columns,
			rows: this.rows
		};
	}
}

/** The model as the arrays a solver takes: costs, bounds and the matrix row by row (CSR). */
export interface CsrModel {
	numCols: number;
	numRows: number;
	offset: number;
	colCost: Float64Array;
	colLower: Float64Array;
	colUpper: Float64Array;
	rowLower: Float64Array;
	rowUpper: Float64Array;
	starts: Int32Array;
	indices: Int32Array;
	values: Float64Array;
	integrality: Int32Array | null;
}

export function toCsr(model: LinearModel, { relaxed = false } = {}): CsrModel {
	const nonZeros = model.rows.reduce((sum, row) => sum + row.columns.length, 0);
	const starts = new Int32Array(model.rows.length + 1);
	const indices = new Int32Array(nonZeros);
	const values = new Float64Array(nonZeros);
	let at = 0;
	model.rows.forEach((row, i) => {
		starts[i] = at;
		indices.set(row.columns, at);
		values.set(row.values, at);
		at += row.columns.length;
	});
	starts[model.rows.length] = at;
	const hasIntegers = !relaxed && model.columns.some((c) => c.integer);
	return {
		numCols: model.columns.length,
		numRows: model.rows.length,
		offset: model.offset,
		colCost: Float64Array.from(model.columns, (c) => c.cost),
		colLower: Float64Array.from(model.columns, (c) => c.lower),
		colUpper: Float64Array.from(model.columns, (c) => c.upper),
		rowLower: Float64Array.from(model.rows, (r) => r.lower),
		rowUpper: Float64Array.from(model.rows, (r) => r.upper),
		starts,
		indices,
		values,
		integrality: hasIntegers ? Int32Array.from(model.columns, (c) => (c.integer ? 1 : 0)) : null
	};
}
