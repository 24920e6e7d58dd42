// CSV uploads (fields, price sets, operations): read the file, check its columns, turn each row into
// the input the aggregate's schema takes, and report every problem by row and column. Importing is the
// caller's, in one transaction, and only when no row has a problem.
import Papa from 'papaparse';
import type { z } from 'zod';
import { toFieldIssues } from '$lib/schemas/issues';

/** Bytes in the largest file taken: far more rows than a farm has, small enough to read in one go. */
export const maxCsvBytes = 1_000_000;

export interface CsvColumn {
	name: string;
	required: boolean;
	/** Cells read as numbers (text that is not a number stays text, so the schema names it). */
	numeric: boolean;
	/** What the template's second row says the column holds. */
	example: string;
}

/** How one aggregate's rows are read: its columns, and a row's cells as the schema's input. */
export interface CsvKind<T> {
	/** What the rows are, for messages: "fields", "operations". */
	noun: string;
	columns: CsvColumn[];
	/** Numeric columns that may appear beyond `columns`, by a prefix (a price per crop: `price:corn`). */
	numericPrefixes?: string[];
	/** A row's non-empty cells by column (numbers already read) as the schema's input. */
	toInput(cells: Map<string, string | number>): unknown;
	schema: z.ZodType<T>;
	/** The column a schema path names (`fuel.basis` → `fuelBasis`); null for the row as a whole. */
	columnOf(path: string): string | null;
}

/** One thing wrong: the spreadsheet row (the header is row 1), the column and what is wrong. */
export interface CsvProblem {
	row: number | null;
	column: string | null;
	message: string;
}

export type CsvRead<T> =
	| { ok: true; rows: T[]; header: string[]; cells: string[][] }
	| { ok: false; problems: CsvProblem[]; header: string[]; cells: string[][] };

const fileProblem = (message: string): CsvProblem => ({ row: null, column: null, message });

/** The upload's text, or why it is refused: none, too large, or not a CSV file. */
export async function readCsvFile(
	file: FormDataEntryValue | null
): Promise<{ ok: true; text: string } | { ok: false; problem: CsvProblem }> {
	if (!(file instanceof File) || file.size === 0) {
		return { ok: false, problem: fileProblem('Choose a CSV file to upload.') };
	}
	if (file.size > maxCsvBytes) {
		return {
			ok: false,
			problem: fileProblem(
				`The file is ${megabytes(file.size)}: a CSV upload is at most 1 MB. Split it into smaller files.`
			)
		};
	}
	const bytes = new Uint8Array(await file.arrayBuffer());
	const looksBinary = bytes.includes(0);
	const namedCsv = /\.(csv|txt)$/i.test(file.name) || /csv|text\/plain/.test(file.type);
	if (looksBinary || !namedCsv) {
		return {
			ok: false,
			problem: fileProblem(
				'That is not a CSV file. Save the sheet as "CSV (comma delimited)" and upload that.'
			)
		};
	}
	try {
		return { ok: true, text: new TextDecoder('utf-8', { fatal: true }).decode(bytes) };
	} catch {
		// Older spreadsheet programs save CSV in Windows-1252.
		return { ok: true, text: new TextDecoder('windows-1252').decode(bytes) };
	}
}

/**
 * Reads CSV text with the kind's columns: a byte-order mark, `;` or tab separators and Windows line
 * ends are taken as spreadsheets write them. Each row is checked whole by the kind's schema.
 */
export function readCsv<T>(text: string, kind: CsvKind<T>): CsvRead<T> {
	if (text.length > maxCsvBytes) {
		return {
			ok: false,
			problems: [fileProblem('A CSV upload is at most 1 MB.')],
			header: [],
			cells: []
		};
	}
	const parsed = Papa.parse<string[]>(text.replace(/^\uFEFF/, ''), {
		delimitersToGuess: [',', ';', '\t'],
		skipEmptyLines: 'greedy'
	});
	const [rawHeader = [], ...cells] = parsed.data;
	const header = rawHeader.map((name) => name.trim());
	const decimalComma = parsed.meta.delimiter === ';';
	const numericColumns = new Set(kind.columns.filter((c) => c.numeric).map((c) => c.name));
	const requiredText = new Set(
		kind.columns.filter((c) => c.required && !c.numeric).map((c) => c.name)
	);
	const prefixes = kind.numericPrefixes ?? [];
	const isNumeric = (column: string) =>
		numericColumns.has(column) || prefixes.some((p) => column.startsWith(p));
	const problems = headerProblems(header, kind);
	for (const error of parsed.errors) {
		// papaparse counts data rows from 0 after the header row; the sheet counts the header as row 1.
		if (error.code === 'UndetectableDelimiter') continue;
		const row = error.row === undefined ? null : error.row + 1;
		problems.push({ row, column: null, message: error.message });
	}
	if (!cells.length && !problems.length) {
		problems.push(fileProblem(`The file has a header row but no ${kind.noun}.`));
	}
	if (problems.length) return { ok: false, problems, header, cells };

	const rows: T[] = [];
	cells.forEach((line, i) => {
		const row = i + 2;
		if (line.length !== header.length) {
			problems.push({
				row,
				column: null,
				message: `Row ${row} has ${line.length} cells; the header has ${header.length}.`
			});
			return;
		}
		const values = new Map<string, string | number>();
		line.forEach((cell, c) => {
			const value = cell.trim();
			// An empty cell is a value left out (the schema's default), but an empty required text is
			// text the schema asks for by name ("Enter the field name.").
			if (value === '') {
				if (requiredText.has(header[c])) values.set(header[c], '');
				return;
			}
			values.set(header[c], isNumeric(header[c]) ? readNumber(value, decimalComma) : value);
		});
		const result = kind.schema.safeParse(kind.toInput(values));
		if (result.success) rows.push(result.data);
		else {
			for (const issue of toFieldIssues(result.error)) {
				problems.push({ row, column: kind.columnOf(issue.path), message: issue.message });
			}
		}
	});
	return problems.length
		? { ok: false, problems, header, cells }
		: { ok: true, rows, header, cells };
}

/** The template: the header row and one example row. */
export function csvTemplate(kind: CsvKind<unknown>): string {
	return Papa.unparse([kind.columns.map((c) => c.name), kind.columns.map((c) => c.example)], {
		newline: '\r\n'
	});
}

/** Names that appear more than once among `names`, or that the farm has already, in file order. */
export function duplicateNames(names: string[], taken: ReadonlySet<string>): string[] {
	const seen = new Set<string>();
	const duplicates = new Set<string>();
	for (const name of names) {
		const folded = name.trim().toLowerCase();
		if (seen.has(folded) || taken.has(folded)) duplicates.add(name);
		seen.add(folded);
	}
	return [...duplicates];
}

function headerProblems(header: string[], kind: CsvKind<unknown>): CsvProblem[] {
	const known = new Set(kind.columns.map((c) => c.name));
	const prefixes = kind.numericPrefixes ?? [];
	const problems: CsvProblem[] = [];
	const missing = kind.columns.filter((c) => c.required && !header.includes(c.name));
	const unknown = header.filter((h) => !known.has(h) && !prefixes.some((p) => h.startsWith(p)));
	const listed = (names: string[]) => names.map((n) => `"${n}"`).join(', ');
	if (missing.length || unknown.length) {
		const parts = [
			missing.length ? `missing ${listed(missing.map((c) => c.name))}` : '',
			unknown.length ? `not known: ${listed(unknown)}` : ''
		].filter(Boolean);
		problems.push({
			row: 1,
			column: null,
			message: `The columns do not match the template (${parts.join('; ')}). Download the template and keep its header row.`
		});
	}
	const repeated = header.filter((h, i) => header.indexOf(h) !== i);
	if (repeated.length) {
		problems.push({ row: 1, column: null, message: `Columns appear twice: ${listed(repeated)}.` });
	}
	return problems;
}

/**
 * A cell as a number when it is one, as spreadsheets write them: `1,250.5` (thousands commas) or, in
 * files separated by `;`, `1.250,5` and `40,5` (decimal commas; `40.5` there keeps its point).
 * Anything else stays text, so the schema names it in its message.
 */
function readNumber(cell: string, decimalComma: boolean): string | number {
	const plain =
		decimalComma && cell.includes(',')
			? cell.replace(/[.\s]/g, '').replace(',', '.')
			: cell.replace(/[,\s]/g, '');
	if (!/^[-+]?(\d+\.?\d*|\.\d+)(e[-+]?\d+)?$/i.test(plain)) return cell;
	const value = Number(plain);
	return Number.isFinite(value) ? value : cell;
}

function megabytes(bytes: number): string {
	return `${(bytes / 1_000_000).toLocaleString('en-US', { maximumFractionDigits: 1 })} MB`;
}
