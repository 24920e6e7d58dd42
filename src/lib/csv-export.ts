import Papa from 'papaparse';
import {
	shownAmount,
	shownPer,
	usResultUnits,
	type ResultUnits
} from './components/plan-results/result-units';
import type { FarmYearSummary } from './engine/plan-summary';

/** CSV for download, built in the browser or on the server (no I/O here). */

export type CsvCell = string | number;

/**
 * OWASP "CSV Injection" (owasp.org/www-community/attacks/CSV_Injection): a spreadsheet runs a cell that
 * starts with =, +, - or @, or with a tab or carriage return, as a formula; prefixing a single quote makes
 * it text. papaparse's own default pattern (`^[=+\-@\t\r].*$`) misses a cell whose first line is a
 * formula and which goes on to a second line, so only the first character is tested here.
 */
const formulaStart = /^[=+\-@\t\r]/;

/**
 * Rows as RFC 4180 CSV. Text cells that start with a formula character are escaped; numbers are not:
 * −1200 passed as a number stays the number −1200. A text cell is always escaped, "-1200" included
 * (the quote keeps it text, as it was given): there is no telling a harmless one from a formula without
 * parsing formulas, so figures go in as numbers.
 */
export function toCsv(rows: CsvCell[][]): string {
	return Papa.unparse(rows, { escapeFormulae: formulaStart, newline: '\r\n' });
}

export type FarmYearSection = 'Returns and costs' | 'Inputs and work' | 'Herd and hay';

/** One line of the whole-farm table: what it is with its unit, and its value in each year. */
export interface FarmYearRow {
	key: string;
	section: FarmYearSection;
	label: string;
	/** Decimal places shown (and exported). */
	digits: number;
	/** A net return: below zero is a loss. */
	signed: boolean;
	/** `null` where a year has no meaningful value (a return per hour with no hours worked). */
	values: (number | null)[];
}

type Line = Omit<FarmYearRow, 'values' | 'signed'> & {
	signed?: boolean;
	value: (year: FarmYearSummary) => number | null;
};

function lines(units: ResultUnits): Line[] {
	const { mass, volume, area } = units;
	const money = 'Returns and costs' as const;
	const work = 'Inputs and work' as const;
	const herd = 'Herd and hay' as const;
	const group = (key: keyof FarmYearSummary['costGroupsUsd'], label: string): Line => ({
		key,
		section: money,
		label: `${label} ($)`,
		digits: 0,
		value: (y) => y.costGroupsUsd[key]
	});
	return [
		{ key: 'revenue', section: money, label: 'Revenue ($)', digits: 0, value: (y) => y.revenueUsd },
		group('directUsd', 'Direct costs: seed, fertiliser, chemicals, hire, interest'),
		group('machineryUsd', 'Machinery: diesel and repairs'),
		group('fieldLabourUsd', 'Field labour'),
		group('cashRentUsd', 'Cash rent'),
		group('hayUsd', 'Hay bought'),
		group('choreLabourUsd', 'Chore labour'),
		group('hiredWageAdjustmentUsd', 'Hired help: wages less the labour rate'),
		group('fixedUsd', 'Fixed costs'),
		{ key: 'costs', section: money, label: 'Total costs ($)', digits: 0, value: (y) => y.costsUsd },
		{
			key: 'netReturn',
			section: money,
			label: 'Net return ($)',
			digits: 0,
			signed: true,
			value: (y) => y.netReturnUsd
		},
		{
			key: 'netReturnPerArea',
			section: money,
			label: `Net return ($/${area.unit})`,
			digits: 2,
			signed: true,
			value: (y) => shownPer(y.netReturnUsdPerAcre, area)
		},
		{
			key: 'netReturnPerFamilyHour',
			section: money,
			label: 'Net return per family labour hour, before the labour charge ($/h)',
			digits: 2,
			signed: true,
			value: (y) => y.netReturnUsdPerFamilyLabourHour
		},
		{
			key: 'nitrogenBought',
			section: work,
			label: `N bought (${mass.unit} N)`,
			digits: 0,
			value: (y) => shownAmount(y.nitrogenPurchasedLb, mass)
		},
		{
			key: 'diesel',
			section: work,
			label: `Diesel (${volume.unit})`,
			digits: 0,
			value: (y) => shownAmount(y.dieselGallons, volume)
		},
		{
			key: 'labourHours',
			section: work,
			label: 'Labour: field work and chores (h)',
			digits: 0,
			value: (y) => y.labourHours
		},
		{
			key: 'hayBales',
			section: herd,
			label: 'Hay bought (bales)',
			digits: 0,
			value: (y) => y.hayBales
		},
		{
			key: 'hayBalesAvoided',
			section: herd,
			label: 'Hay not needed because the herd grazed (bales)',
			digits: 0,
			value: (y) => y.hayBalesAvoided
		},
		{
			key: 'hayUsdAvoided',
			section: herd,
			label: 'Hay not needed because the herd grazed ($)',
			digits: 0,
			value: (y) => y.hayUsdAvoided
		},
		{
			key: 'hayUsdAvoidedPerGrazedArea',
			section: herd,
			label: `Hay not needed, per grazed ${area.unit} ($/${area.unit})`,
			digits: 2,
			value: (y) => shownPer(y.hayUsdAvoidedPerGrazedAcre, area)
		}
	];
}

/** The whole-farm table's rows (years are its columns): one source for the table and its CSV. */
export function farmYearTableRows(
	farmYears: FarmYearSummary[],
	units: ResultUnits = usResultUnits
): FarmYearRow[] {
	return lines(units).map(({ value, signed = false, ...line }) => ({
		...line,
		signed,
		values: farmYears.map(value)
	}));
}

/** The whole-farm table as CSV rows: a header of years, then each row at the table's precision. */
export function farmYearCsvRows(
	farmYears: FarmYearSummary[],
	units: ResultUnits = usResultUnits
): CsvCell[][] {
	const round = (value: number | null, digits: number) =>
		value === null ? '' : Number(value.toFixed(digits));
	return [
		['Whole farm', ...farmYears.map((y) => y.year)],
		...farmYearTableRows(farmYears, units).map((row) => [
			row.label,
			...row.values.map((v) => round(v, row.digits))
		])
	];
}
