// What each CSV upload holds: its columns (named as the API's JSON names, US customary units like the
// plan file) and how a row becomes the aggregate's API body.
import { fieldBodySchema, type FieldBody } from '$lib/schemas/farm-setup';
import type { CsvColumn, CsvKind } from './csv-upload';

const column = (name: string, example: string, numeric: boolean, required = false): CsvColumn => ({
	name,
	example,
	numeric,
	required
});

/** Cells under their column names, for a schema whose keys are the column names. */
const cellsAsObject = (cells: Map<string, string | number>) => Object.fromEntries(cells);
const topLevelColumn = (known: Set<string>) => (path: string) => {
	const first = path.split('.')[0];
	return known.has(first) ? first : null;
};

const fieldColumns = [
	column('name', 'North Forty', false, true),
	column('acres', '40.5', true, true),
	column('productivityIndex', '1.05', true),
	column('priorCrop', 'soybean', false),
	column('priorCropNitrogenCreditLbPerAcre', '0', true),
	column('tenure', 'cash-rented', false),
	column('cashRentUsdPerAcre', '245', true),
	column('notes', 'Tile drained in the east half.', false)
];

export const fieldsCsv: CsvKind<FieldBody> = {
	noun: 'fields',
	columns: fieldColumns,
	toInput: cellsAsObject,
	// No key column: each field's key is made from its name on import.
	schema: fieldBodySchema,
	columnOf: topLevelColumn(new Set(fieldColumns.map((c) => c.name)))
};
