import { readFileSync } from 'node:fs';
import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import { farmYearCsvRows, farmYearTableRows, toCsv } from '../../src/lib/csv-export';
import { evaluatePlan, summarisePlan, type FarmYearSummary } from '../../src/lib/engine';
import { formatNumber } from '../../src/lib/format';
import { parsePlanDocument } from '../../src/lib/schemas/plan-file';

function summary(name: string, edit: (doc: Record<string, unknown>) => void = () => {}) {
	const doc = JSON.parse(readFileSync(`scenarios/${name}.json`, 'utf8'));
	edit(doc);
	const parsed = parsePlanDocument(doc);
	if (!parsed.ok) throw new Error(JSON.stringify(parsed.issues));
	// `PlanSummary` still types `farmYears` as `FarmYearResult[]`; `summarisePlan` gives summaries.
	return { farmYears: summarisePlan(evaluatePlan(parsed.plan)).farmYears as FarmYearSummary[] };
}

/** The cells a spreadsheet (or papaparse) reads back from the CSV, numbers as numbers. */
function readBack(csv: string): unknown[][] {
	return Papa.parse<unknown[]>(csv, { dynamicTyping: true, skipEmptyLines: true }).data;
}

describe('toCsv', () => {
	// OWASP "CSV Injection" (owasp.org/www-community/attacks/CSV_Injection): cells starting with
	// = + - @ tab or carriage return are prefixed with a single quote so a spreadsheet shows them as text.
	it.each([
		['=1+2', "'=1+2"],
		['+1+2', "'+1+2"],
		['-2+3+cmd', "'-2+3+cmd"],
		['@SUM(A1:A2)', "'@SUM(A1:A2)"],
		['\t=1', "'\t=1"],
		['\r=1', "'\r=1"]
	])('escapes the text cell %j', (cell, escaped) => {
		const csv = toCsv([['Field note', cell]]);
		expect(readBack(csv)).toEqual([['Field note', escaped]]);
	});

	it('escapes a formula whose cell goes on past a line break', () => {
		// OWASP "CSV Injection": the first character decides; papaparse's own pattern misses this cell.
		const cell = '=HYPERLINK("http://example.invalid","x")\nsecond line';
		expect(readBack(toCsv([[cell]]))).toEqual([[`'${cell}`]]);
	});

	it('keeps a negative number a number, and quotes a text "-1200" as text', () => {
		const csv = toCsv([[-1200, '-1200']]);
		expect(csv).toBe(`-1200,"'-1200"`);
		expect(readBack(csv)).toEqual([[-1200, "'-1200"]]);
	});

	it('leaves other text alone and quotes commas and quotes as RFC 4180 says', () => {
		// RFC 4180 §2.6: a field with a comma or quote is enclosed in quotes; §2.7: a quote inside is doubled.
		const csv = toCsv([['Net return ($)', 'Corn, "wide" rows', 'Oat–pea']]);
		expect(csv).toBe('Net return ($),"Corn, ""wide"" rows",Oat–pea');
	});

	it('ends rows with CRLF', () => {
		// RFC 4180 §2.1: each record is located on a separate line, delimited by a line break (CRLF).
		expect(toCsv([['a'], ['b']])).toBe('a\r\nb');
	});
});

describe('the whole-farm table as CSV', () => {
	const reference = summary('reference');

	it('has a header of years and the same lines as the table, at the table’s precision', () => {
		const rows = farmYearCsvRows(reference.farmYears);
		const table = farmYearTableRows(reference.farmYears);
		// The demo plans run five years from 2027 (scenarios/*.json).
		expect(rows[0]).toEqual(['Whole farm', 2027, 2028, 2029, 2030, 2031]);
		expect(rows.slice(1).map((r) => r[0])).toEqual(table.map((r) => r.label));
		for (const [i, line] of table.entries()) {
			for (const [y, value] of line.values.entries()) {
				const cell = rows[i + 1][y + 1] as number;
				// What the table prints, and no more decimals than it prints.
				expect(formatNumber(cell, line.digits)).toBe(formatNumber(value, line.digits));
				expect(String(cell)).toMatch(
					line.digits ? new RegExp(`^-?\\d+(\\.\\d{1,${line.digits}})?$`) : /^-?\d+$/
				);
			}
		}
	});

	it('writes losses as negative numbers a spreadsheet can add up, not as escaped text', () => {
		// Half the crop prices: the demo farm's fixed costs turn every year to a loss.
		const loss = summary('reference', (doc) => {
			for (const set of doc.priceSets as { cropPricesUsdPerUnit: Record<string, number> }[]) {
				for (const crop of Object.keys(set.cropPricesUsdPerUnit))
					set.cropPricesUsdPerUnit[crop] /= 2;
			}
		});
		const csv = toCsv(farmYearCsvRows(loss.farmYears));
		const netReturn = readBack(csv).find((r) => r[0] === 'Net return ($)')!;
		expect(netReturn.slice(1)).toHaveLength(5);
		for (const cell of netReturn.slice(1)) {
			expect(typeof cell).toBe('number');
			expect(cell as number).toBeLessThan(0);
		}
		expect(csv).not.toContain("'-");
	});

	it('leaves a year with no return per hour empty', () => {
		const years = reference.farmYears.map((y, i) =>
			i === 0 ? { ...y, netReturnUsdPerFamilyLabourHour: null } : y
		);
		const row = farmYearCsvRows(years).find((r) =>
			String(r[0]).includes('per family labour hour')
		)!;
		expect(row[1]).toBe('');
		expect(typeof row[2]).toBe('number');
	});
});
