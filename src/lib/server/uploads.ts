// The farm's CSV uploads, one entry per kind: its columns, the checks only the farm's data can make,
// and how its rows are imported, all or none.
import type { Db } from './db/client';
import { importFields, listFields } from './db/fields';
import { addFieldOperations, listFieldOperations } from './db/field-operations';
import { createPriceSets, listPriceSets } from './db/price-sets';
import { fieldsCsv, operationsCsv, priceColumnOf, priceSetsCsv } from './csv-kinds';
import { csvTemplate, readCsv, type CsvKind, type CsvProblem } from './csv-upload';
import { operationKeyTakenMessage } from './operation-setup';
import { findPriceableIds, unknownIdIssues, yearTakenMessage } from './prices';

/** What the preview shows: the file as read and every problem in it. */
export interface Preview {
	header: string[];
	cells: string[][];
	problems: CsvProblem[];
}

export interface Upload {
	title: string;
	/** The page the rows land on, under the farm. */
	listPath: string;
	/** A line on the page about the file's units or columns. */
	note: string;
	csv: Pick<CsvKind<unknown>, 'noun' | 'columns'>;
	template(): string;
	preview(db: Db, farmId: string, text: string): Promise<Preview>;
	/** Checks the text again and imports every row in one transaction; the preview when it cannot. */
	importText(
		db: Db,
		farmId: string,
		userId: string,
		text: string
	): Promise<{ imported: number } | { refused: Preview }>;
}

interface UploadSpec<T> {
	title: string;
	listPath: string;
	note: string;
	csv: CsvKind<T>;
	/** Problems only the farm's data shows (a name it has, a crop it does not grow), by row. */
	checkRows(db: Db, farmId: string, rows: T[]): Promise<CsvProblem[]>;
	/** All rows in one transaction, or none and why (a name taken since the check). */
	importRows(
		db: Db,
		farmId: string,
		userId: string,
		rows: T[]
	): Promise<{ imported: number } | { problems: CsvProblem[] }>;
}

/** The sheet's row of the i-th data row: the header is row 1. */
const sheetRow = (i: number) => i + 2;

function defineUpload<T>(spec: UploadSpec<T>): Upload {
	const { csv, checkRows, importRows, ...shown } = spec;
	async function check(db: Db, farmId: string, text: string) {
		const read = readCsv(text, csv);
		const problems = read.ok ? await checkRows(db, farmId, read.rows) : read.problems;
		return { read, preview: { header: read.header, cells: read.cells, problems } };
	}
	return {
		...shown,
		csv,
		template: () => csvTemplate(csv),
		preview: async (db, farmId, text) => (await check(db, farmId, text)).preview,
		async importText(db, farmId, userId, text) {
			const { read, preview } = await check(db, farmId, text);
			if (!read.ok || preview.problems.length) return { refused: preview };
			const result = await importRows(db, farmId, userId, read.rows);
			return 'imported' in result ? result : { refused: { ...preview, problems: result.problems } };
		}
	};
}

/**
 * Each row whose value in `column` another row of the file, or the farm, already has (`taken`, as
 * `fold` writes them); the rest have none. Messages say which, from the value and the earlier row.
 */
function repeatedValueProblems(
	values: (string | undefined)[],
	taken: ReadonlySet<string>,
	column: string,
	fold: (value: string) => string,
	say: { taken: (value: string) => string; again: (value: string, row: number) => string }
): CsvProblem[] {
	const firstRow = new Map<string, number>();
	return values.flatMap((value, i) => {
		if (value === undefined) return [];
		const folded = fold(value);
		const earlier = firstRow.get(folded);
		if (earlier === undefined) firstRow.set(folded, sheetRow(i));
		const message = taken.has(folded)
			? say.taken(value)
			: earlier !== undefined
				? say.again(value, earlier)
				: null;
		return message ? [{ row: sheetRow(i), column, message }] : [];
	});
}

const foldName = (name: string) => name.trim().toLowerCase();

function repeatedNameProblems(names: string[], taken: ReadonlySet<string>) {
	return repeatedValueProblems(names, taken, 'name', foldName, {
		taken: (name) =>
			`The farm already has a field named "${name}": rename the row, or change that field on the fields page.`,
		again: (name, row) => `"${name}" is also the name in row ${row}: give each field its own name.`
	});
}

const fieldsUpload = defineUpload({
	title: 'Fields',
	listPath: 'fields',
	note: 'Areas in acres and rent in $ per acre a year, as in plan files, whatever unit system the farm shows. Tenure is "owned" or "cash-rented".',
	csv: fieldsCsv,
	async checkRows(db, farmId, rows) {
		const fields = await listFields(db, farmId);
		const taken = new Set(fields.map((field) => foldName(field.name)));
		return repeatedNameProblems(
			rows.map((row) => row.name),
			taken
		);
	},
	async importRows(db, farmId, userId, rows) {
		const result = await importFields(db, farmId, userId, rows);
		if ('imported' in result) return result;
		const taken = new Set(result.duplicates.map(foldName));
		return {
			problems: repeatedNameProblems(
				rows.map((row) => row.name),
				taken
			)
		};
	}
});

const priceSetsUpload = defineUpload({
	title: 'Prices',
	listPath: 'prices',
	note: 'One row a year, in US units as in plan files: crop prices per sale unit in columns "crop:<crop id>", seed prices in "seedPerThousand:<seed id>" or "seedPerLb:<seed id>", custom rates per acre in "customRate:<operation id>".',
	csv: priceSetsCsv,
	async checkRows(db, farmId, rows) {
		const [known, stored] = await Promise.all([
			findPriceableIds(db, farmId),
			listPriceSets(db, farmId)
		]);
		const storedYears = new Set(stored.map((set) => set.year));
		const years = new Map<number, number>();
		return rows.flatMap((set, i) => {
			const problems: CsvProblem[] = unknownIdIssues(set, known).map((issue) => ({
				row: sheetRow(i),
				column: priceColumnOf(issue.path),
				message: issue.message
			}));
			const earlier = years.get(set.year);
			if (storedYears.has(set.year)) {
				problems.push({ row: sheetRow(i), column: 'year', message: yearTakenMessage(set.year) });
			} else if (earlier !== undefined) {
				problems.push({
					row: sheetRow(i),
					column: 'year',
					message: `${set.year} is also the year in row ${earlier}: one row a year.`
				});
			} else years.set(set.year, sheetRow(i));
			return problems;
		});
	},
	async importRows(db, farmId, userId, rows) {
		const saved = await createPriceSets(db, farmId, userId, rows);
		if (saved.ok) return { imported: saved.priceSets.length };
		const taken = new Set(saved.takenYears);
		return {
			problems: rows.flatMap((set, i) =>
				taken.has(set.year)
					? [{ row: sheetRow(i), column: 'year', message: yearTakenMessage(set.year) }]
					: []
			)
		};
	}
});

function repeatedKeyProblems(keys: (string | undefined)[], taken: ReadonlySet<string>) {
	return repeatedValueProblems(keys, taken, 'key', (key) => key, {
		taken: operationKeyTakenMessage,
		again: (key, row) => `"${key}" is also the key in row ${row}: give each operation its own key.`
	});
}

const operationsUpload = defineUpload({
	title: 'Field operations',
	listPath: 'operations',
	note: 'US units as in plan files (mph, ft, gal per acre, hp). "by" is "own" or "custom"; an own operation is "statedAs" "machine" (speed, width, efficiency and fuelBasis "per-acre" or "pto-power") or "per-acre" (diesel, machine and labour hours per acre). A key left empty is made from the name.',
	csv: operationsCsv,
	async checkRows(db, farmId, rows) {
		const stored = await listFieldOperations(db, farmId);
		return repeatedKeyProblems(
			rows.map((row) => row.key),
			new Set(stored.map((operation) => operation.key))
		);
	},
	async importRows(db, farmId, userId, rows) {
		const result = await addFieldOperations(db, farmId, userId, rows);
		if ('added' in result) return { imported: result.added.length };
		const { index, key } = result.keyTaken;
		return {
			problems: [{ row: sheetRow(index), column: 'key', message: operationKeyTakenMessage(key) }]
		};
	}
});

/** Uploads by the name in their URL (`/farms/…/upload/fields`). */
export const uploads = new Map<string, Upload>([
	['fields', fieldsUpload],
	['price-sets', priceSetsUpload],
	['operations', operationsUpload]
]);
