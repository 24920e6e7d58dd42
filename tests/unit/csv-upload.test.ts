// Reading CSV uploads as spreadsheets write them, and naming each problem by row and column.
import { describe, expect, it } from 'vitest';
import { fieldsCsv, operationsCsv, priceSetsCsv } from '../../src/lib/server/csv-kinds';
import {
	csvTemplate,
	duplicateNames,
	maxCsvBytes,
	readCsv,
	readCsvFile
} from '../../src/lib/server/csv-upload';

const header = 'name,acres,productivityIndex,tenure,cashRentUsdPerAcre';

describe('reading a fields CSV', () => {
	it('reads rows into fields, the schema’s defaults filled in', () => {
		const read = readCsv(
			`${header}\nNorth Forty,40.5,1.05,owned,\nRented 80,80,,cash-rented,245\n`,
			fieldsCsv
		);
		expect(read.ok).toBe(true);
		if (!read.ok) return;
		expect(read.rows).toEqual([
			expect.objectContaining({
				name: 'North Forty',
				acres: 40.5,
				productivityIndex: 1.05,
				cashRentUsdPerAcre: 0
			}),
			expect.objectContaining({
				name: 'Rented 80',
				tenure: 'cash-rented',
				cashRentUsdPerAcre: 245,
				productivityIndex: 1
			})
		]);
	});

	it('takes a byte-order mark, Windows line ends and quoted thousands as a spreadsheet saves them', () => {
		const text = `\uFEFF${header}\r\n"Home Section","1,240.25",1,owned,0\r\n`;
		const read = readCsv(text, fieldsCsv);
		expect(read.ok && read.rows[0]).toMatchObject({ name: 'Home Section', acres: 1240.25 });
	});

	it('takes `;` separators with decimal commas, as European spreadsheets save CSV', () => {
		const text = `${header.replaceAll(',', ';')}\r\nWest Hill;40,5;0,95;cash-rented;1.210,50\r\nEast;12.5;1;owned;0\r\n`;
		const read = readCsv(text, fieldsCsv);
		expect(read.ok).toBe(true);
		if (!read.ok) return;
		expect(read.rows.map((r) => [r.acres, r.productivityIndex, r.cashRentUsdPerAcre])).toEqual([
			[40.5, 0.95, 1210.5],
			[12.5, 1, 0]
		]);
	});

	it('names every bad row by its spreadsheet row (the header is row 1) and column', () => {
		const text = `${header}\nGood,10,1,owned,0\n,ten,1,owned,0\nRented,5,1,owned,150\n`;
		const read = readCsv(text, fieldsCsv);
		expect(read.ok).toBe(false);
		if (read.ok) return;
		expect(read.problems).toEqual([
			{ row: 3, column: 'name', message: 'Enter the field name.' },
			{ row: 3, column: 'acres', message: 'Enter field area as a number.' },
			{
				row: 4,
				column: 'cashRentUsdPerAcre',
				message: 'An owned field pays no cash rent: set the tenure to cash-rented or the rent to 0.'
			}
		]);
	});

	it('refuses a file whose columns are not the template’s, naming what is missing and unknown', () => {
		const read = readCsv('field,size\nNorth,40\n', fieldsCsv);
		expect(read.ok).toBe(false);
		if (read.ok) return;
		expect(read.problems).toEqual([
			{
				row: 1,
				column: null,
				message:
					'The columns do not match the template (missing "name", "acres"; not known: "field", "size"). Download the template and keep its header row.'
			}
		]);
	});

	it('refuses a row with too few cells and a file with no rows', () => {
		const short = readCsv(`${header}\nNorth,40\n`, fieldsCsv);
		expect(!short.ok && short.problems[0]).toMatchObject({ row: 2 });
		const empty = readCsv(`${header}\n`, fieldsCsv);
		expect(!empty.ok && empty.problems[0].message).toBe('The file has a header row but no fields.');
	});

	it('writes a template that reads back as one valid field', () => {
		const read = readCsv(csvTemplate(fieldsCsv), fieldsCsv);
		expect(read.ok && read.rows).toHaveLength(1);
	});
});

describe('the uploaded file', () => {
	const file = (content: BlobPart, name: string, type = 'text/csv') =>
		new File([content], name, { type });

	it('refuses no file, a file over 1 MB and a file that is not CSV, each with a message', async () => {
		expect(await readCsvFile(null)).toMatchObject({
			ok: false,
			problem: { message: 'Choose a CSV file to upload.' }
		});
		const big = await readCsvFile(file('x'.repeat(maxCsvBytes + 1), 'big.csv'));
		expect(big).toMatchObject({
			ok: false,
			problem: { message: expect.stringContaining('at most 1 MB') }
		});
		const sheet = await readCsvFile(
			file(
				new Uint8Array([0x50, 0x4b, 3, 4, 0, 0]),
				'fields.xlsx',
				'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet'
			)
		);
		expect(sheet).toMatchObject({
			ok: false,
			problem: { message: expect.stringContaining('not a CSV file') }
		});
	});

	it('reads UTF-8, and Windows-1252 from older spreadsheet programs', async () => {
		expect(await readCsvFile(file('name\nCafé', 'a.csv'))).toEqual({
			ok: true,
			text: 'name\nCafé'
		});
		// 0xE9 is é in Windows-1252 and not valid UTF-8 on its own
		const latin = await readCsvFile(file(new Uint8Array([0x43, 0x61, 0x66, 0xe9]), 'b.csv'));
		expect(latin).toEqual({ ok: true, text: 'Café' });
	});
});

describe('duplicate names', () => {
	it('lists names repeated in the file or already on the farm, ignoring case and spaces', () => {
		expect(duplicateNames(['North', 'south ', 'NORTH', 'East'], new Set(['south']))).toEqual([
			'south ',
			'NORTH'
		]);
	});
});

describe('reading a price-set CSV', () => {
	const head =
		'year;nitrogenUsdPerLb;dieselUsdPerGallon;labourUsdPerHour;hayUsdPerBale;crop:corn;seedPerThousand:corn-seed;seedPerLb:cereal-rye;customRate:combine';

	it('reads one year a row, with prices by crop, seed and operation in prefixed columns', () => {
		const read = readCsv(`${head}\r\n2027;0,55;3,60;22;60;4,40;3,9;0,32;38\r\n`, priceSetsCsv);
		expect(read.ok && read.rows).toEqual([
			{
				year: 2027,
				nitrogenUsdPerLb: 0.55,
				dieselUsdPerGallon: 3.6,
				labourUsdPerHour: 22,
				hayUsdPerBale: 60,
				cropPricesUsdPerUnit: { corn: 4.4 },
				seedPrices: { 'corn-seed': { usdPerThousandSeeds: 3.9 }, 'cereal-rye': { usdPerLb: 0.32 } },
				customRatesUsdPerAcre: { combine: 38 }
			}
		]);
	});

	it('names a bad price by its own column', () => {
		const read = readCsv(`${head}\n2027;0,55;3,60;22;60;-4;3,9;abc;38\n`, priceSetsCsv);
		expect(!read.ok && read.problems.map((p) => [p.row, p.column])).toEqual([
			[2, 'crop:corn'],
			[2, 'seedPerLb:cereal-rye']
		]);
	});
});

describe('reading an operations CSV', () => {
	const head =
		'name,key,by,month,statedAs,speedMph,widthFt,fieldEfficiencyPercent,fuelBasis,dieselGallonsPerAcre,tractorMaxPtoHp,dieselGallonsPerHpHour,labourFactor,repairsUsdPerAcre,machineHoursPerAcre,labourHoursPerAcre';

	it('reads each of the three ways an operation is stated', () => {
		const text = [
			head,
			'Disk,,own,4,machine,6,24,80,pto-power,,180,,1.1,2,,',
			// Univ. of Missouri G1208: no-till drill 0.33 gal/ac (REFERENCE-VALUES §2)
			'No-till drill,,own,5,per-acre,,,,,0.33,,,,,0.1,0.12',
			'Combining,custom-combine,custom,10,,,,,,,,,,,,'
		].join('\n');
		const read = readCsv(text, operationsCsv);
		expect(read.ok && read.rows).toEqual([
			expect.objectContaining({
				by: 'own',
				statedAs: 'machine',
				speedMph: 6,
				fuel: { basis: 'pto-power', tractorMaxPtoHp: 180, dieselGallonsPerHpHour: 0.044 }
			}),
			expect.objectContaining({
				statedAs: 'per-acre',
				dieselGallonsPerAcre: 0.33,
				machineHoursPerAcre: 0.1,
				labourHoursPerAcre: 0.12
			}),
			{ name: 'Combining', key: 'custom-combine', by: 'custom', month: 10 }
		]);
	});

	it('names a fuel problem by its own column, and a per-acre row with machine values', () => {
		const text = [
			head,
			'Disk,,own,4,machine,6,24,80,per-acre,25,,,1.1,2,,',
			'Drill,,own,5,per-acre,6,,,,0.33,,,,,0.1,0.12'
		].join('\n');
		const read = readCsv(text, operationsCsv);
		expect(!read.ok && read.problems.map((p) => [p.row, p.column])).toEqual([
			[2, 'dieselGallonsPerAcre'],
			[3, null]
		]);
	});

	it('writes a template that reads back as one valid operation', () => {
		const read = readCsv(csvTemplate(operationsCsv), operationsCsv);
		expect(read.ok && read.rows).toHaveLength(1);
	});
});
