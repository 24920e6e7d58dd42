// What each CSV upload holds: its columns (named as the API's JSON names, US customary units like the
// plan file) and how a row becomes the aggregate's API body.
import { fieldBodySchema, type FieldBody } from '$lib/schemas/farm-setup';
import { operationBodySchema, type OperationBody } from '$lib/schemas/operations';
import { priceSetBodySchema, type PriceSet } from '$lib/schemas/price-sets';
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

// A price set's maps by id, each in columns of its own prefix: `crop:corn`, `seedPerLb:cereal-rye`.
const pricePrefixes = {
	crop: 'crop:',
	seedPerThousand: 'seedPerThousand:',
	seedPerLb: 'seedPerLb:',
	customRate: 'customRate:'
} as const;

const priceColumns = [
	column('year', '2027', true, true),
	column('nitrogenUsdPerLb', '0.55', true, true),
	column('dieselUsdPerGallon', '3.60', true, true),
	column('labourUsdPerHour', '22', true, true),
	column('hayUsdPerBale', '60', true, true)
];

export const priceSetsCsv: CsvKind<PriceSet> = {
	noun: 'price sets',
	columns: priceColumns,
	numericPrefixes: Object.values(pricePrefixes),
	toInput(cells) {
		const set: Record<string, unknown> = {};
		const crops: Record<string, unknown> = {};
		const seeds: Record<string, Record<string, unknown>> = {};
		const rates: Record<string, unknown> = {};
		const seed = (id: string) => (seeds[id] ??= {});
		for (const [name, value] of cells) {
			const [prefix, id] = splitPrefix(name);
			if (prefix === pricePrefixes.crop) crops[id] = value;
			else if (prefix === pricePrefixes.seedPerThousand) seed(id).usdPerThousandSeeds = value;
			else if (prefix === pricePrefixes.seedPerLb) seed(id).usdPerLb = value;
			else if (prefix === pricePrefixes.customRate) rates[id] = value;
			else set[name] = value;
		}
		return {
			...set,
			cropPricesUsdPerUnit: crops,
			seedPrices: seeds,
			customRatesUsdPerAcre: rates
		};
	},
	schema: priceSetBodySchema,
	columnOf: priceColumnOf
};

/** The column a price-set path is read from: `cropPricesUsdPerUnit.corn` → `crop:corn`. */
export function priceColumnOf(path: string): string | null {
	const [top, id, leaf] = path.split('.');
	if (top === 'cropPricesUsdPerUnit' && id) return pricePrefixes.crop + id;
	if (top === 'customRatesUsdPerAcre' && id) return pricePrefixes.customRate + id;
	if (top === 'seedPrices' && id) {
		return (leaf === 'usdPerLb' ? pricePrefixes.seedPerLb : pricePrefixes.seedPerThousand) + id;
	}
	return priceColumns.some((c) => c.name === top) ? top : null;
}

function splitPrefix(name: string): [string, string] {
	const colon = name.indexOf(':');
	return colon < 0 ? ['', name] : [name.slice(0, colon + 1), name.slice(colon + 1)];
}

// Operations: one row each, the columns of all three ways an operation is stated; a row fills those of
// its own way (`by` own or custom; an own one `statedAs` machine or per-acre) and leaves the others empty.
const fuelColumns = new Map([
	['fuelBasis', 'basis'],
	['tractorMaxPtoHp', 'tractorMaxPtoHp'],
	['dieselGallonsPerHpHour', 'dieselGallonsPerHpHour']
]);

const operationColumns = [
	column('name', 'Field cultivator, 30 ft', false, true),
	column('key', 'field-cultivator', false),
	column('by', 'own', false, true),
	column('month', '4', true, true),
	column('statedAs', 'machine', false),
	column('speedMph', '7', true),
	column('widthFt', '30', true),
	column('fieldEfficiencyPercent', '85', true),
	column('fuelBasis', 'per-acre', false),
	column('dieselGallonsPerAcre', '0.6', true),
	column('tractorMaxPtoHp', '', true),
	column('dieselGallonsPerHpHour', '', true),
	column('labourFactor', '1.1', true),
	column('repairsUsdPerAcre', '1.5', true),
	column('machineHoursPerAcre', '', true),
	column('labourHoursPerAcre', '', true)
];

export const operationsCsv: CsvKind<OperationBody> = {
	noun: 'operations',
	columns: operationColumns,
	toInput(cells) {
		const byMachine = cells.get('by') === 'own' && cells.get('statedAs') === 'machine';
		if (!byMachine) return Object.fromEntries(cells);
		// A machine's diesel is stated per acre or from its tractor's power: the plan file's `fuel`.
		const operation: Record<string, unknown> = {};
		const fuel: Record<string, unknown> = {};
		for (const [name, value] of cells) {
			const fuelKey = fuelColumns.get(name);
			if (fuelKey) fuel[fuelKey] = value;
			else if (name === 'dieselGallonsPerAcre') fuel.dieselGallonsPerAcre = value;
			else operation[name] = value;
		}
		return { ...operation, fuel };
	},
	schema: operationBodySchema,
	columnOf(path) {
		const [top, inner] = path.split('.');
		if (top === 'fuel') {
			if (!inner) return 'fuelBasis';
			return [...fuelColumns].find(([, key]) => key === inner)?.[0] ?? inner;
		}
		return operationColumns.some((c) => c.name === top) ? top : null;
	}
};
