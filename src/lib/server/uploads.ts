// The farm's CSV uploads, one entry per kind: its columns and how its rows are imported, all or none.
import type { Db } from './db/client';
import { importFields } from './db/fields';
import { fieldsCsv } from './csv-kinds';
import { csvTemplate, readCsv, type CsvKind, type CsvRead } from './csv-upload';

type ImportResult = { imported: number } | { duplicates: string[] };

export interface Upload {
	title: string;
	/** The page the rows land on, under the farm. */
	listPath: string;
	/** A line on the page about the file's units or columns. */
	note: string;
	csv: Pick<CsvKind<unknown>, 'noun' | 'columns'>;
	template(): string;
	read(text: string): CsvRead<unknown>;
	/** Reads the text again and imports every row in one transaction, or none. */
	importText(
		db: Db,
		farmId: string,
		userId: string,
		text: string
	): Promise<{ refused: CsvRead<unknown> } | ImportResult>;
}

function defineUpload<T>(spec: {
	title: string;
	listPath: string;
	note: string;
	csv: CsvKind<T>;
	importRows(db: Db, farmId: string, userId: string, rows: T[]): Promise<ImportResult>;
}): Upload {
	const { csv, importRows, ...shown } = spec;
	return {
		...shown,
		csv,
		template: () => csvTemplate(csv),
		read: (text) => readCsv(text, csv),
		async importText(db, farmId, userId, text) {
			const read = readCsv(text, csv);
			return read.ok ? importRows(db, farmId, userId, read.rows) : { refused: read };
		}
	};
}

/** Uploads by the name in their URL (`/farms/…/upload/fields`). */
export const uploads = new Map<string, Upload>([
	[
		'fields',
		defineUpload({
			title: 'Fields',
			listPath: 'fields',
			note: 'Areas in acres and rent in $ per acre a year, as in plan files, whatever unit system the farm shows. Tenure is "owned" or "cash-rented".',
			csv: fieldsCsv,
			importRows: importFields
		})
	]
]);
