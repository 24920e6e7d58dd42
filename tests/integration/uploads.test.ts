// CSV uploads of fields through the upload page, as a browser without JavaScript posts them: a preview
// with every problem by row and column, then an import of all rows in one transaction, or none.
import { and, eq } from 'drizzle-orm';
import { beforeAll, describe, expect, it } from 'vitest';
import { auditLog, fields } from '../../src/lib/server/db/schema';
import { testDb } from '../support/db';
import type { Client } from '../support/http';
import { farmSnapshot, ownFarm, reviewerOf } from './farm-setup-support';

const db = testDb();
const header = 'name,acres,productivityIndex,priorCrop,tenure,cashRentUsdPerAcre,notes';

let owner: Client;
let farmId: string;
const page = () => `/farms/${farmId}/upload/fields`;

function upload(client: Client, content: BlobPart, name = 'fields.csv', type = 'text/csv') {
	const body = new FormData();
	body.append('file', new File([content], name, { type }));
	return client.fetch(`${page()}?/preview`, {
		method: 'POST',
		body,
		headers: { Accept: 'text/html' }
	});
}

/** The hidden copy of the file the preview sends back with its import button. */
const readyCsv = (html: string) => {
	const match = /<input type="hidden" name="csv" value="([^"]*)"/.exec(html);
	return match && match[1].replaceAll('&quot;', '"').replaceAll('&amp;', '&');
};

beforeAll(async () => {
	({ owner, farmId } = await ownFarm('uploads'));
});

describe('uploading fields', () => {
	const bad = `${header}\r\nCreek Eighty,80,1,corn,cash-rented,240,\r\nHill Ten,-10,1,,owned,0,\r\n`;
	const fixed = bad.replace('Hill Ten,-10', 'Hill Ten,10');

	it('a bad row: the preview names its row and column, and nothing is saved', async () => {
		const before = await farmSnapshot(db, farmId);
		const response = await upload(owner, bad);
		expect(response.status).toBe(400);
		const html = await response.text();
		expect(html).toMatch(
			/data-problem-row="3"[^]*?acres[^]*?Field area must be at least 0.01 acres./
		);
		expect(html).toContain('Nothing was imported');
		expect(readyCsv(html)).toBeNull();
		expect(await farmSnapshot(db, farmId)).toEqual(before);
	});

	it('fixed: the preview offers the import, which adds every row and says how many', async () => {
		const preview = await upload(owner, fixed);
		expect(preview.status).toBe(200);
		const csv = readyCsv(await preview.text());
		expect(csv).toBe(fixed);
		const response = await owner.postForm(`${page()}?/import`, { csv: csv! });
		expect(response.status).toBe(303);
		expect(response.headers.get('location')).toBe(`/farms/${farmId}/fields?imported=2`);
		const rows = await db.select().from(fields).where(eq(fields.farmId, farmId));
		expect(rows.map((r) => [r.key, r.acres, r.tenure, r.cashRentUsdPerAcre]).sort()).toEqual([
			['creek-eighty', 80, 'cash-rented', 240],
			['hill-ten', 10, 'owned', 0]
		]);
		const audit = await db
			.select()
			.from(auditLog)
			.where(and(eq(auditLog.farmId, farmId), eq(auditLog.action, 'fields.imported')));
		expect(audit.map((a) => a.detail)).toEqual([{ count: 2, names: ['Creek Eighty', 'Hill Ten'] }]);
	});

	it('again: each name it would repeat is named by its row, and nothing is imported', async () => {
		const before = await farmSnapshot(db, farmId);
		const again = `${header}\nNew Quarter,160,1,,owned,0,\nCREEK EIGHTY,80,1,,owned,0,\nnew quarter,5,1,,owned,0,\n`;
		const preview = await upload(owner, again);
		expect(preview.status).toBe(400);
		const html = await preview.text();
		expect(html).toMatch(
			/data-problem-row="3"[^]*?The farm already has a field named "CREEK EIGHTY"/
		);
		expect(html).toMatch(/data-problem-row="4"[^]*?"new quarter" is also the name in row 2/);
		const response = await owner.postForm(`${page()}?/import`, { csv: again });
		expect(response.status).toBe(400);
		expect(await farmSnapshot(db, farmId)).toEqual(before);
	});

	it('an import whose text was changed after the preview is checked again, and refused', async () => {
		const before = await farmSnapshot(db, farmId);
		const response = await owner.postForm(`${page()}?/import`, { csv: bad });
		expect(response.status).toBe(400);
		expect(await farmSnapshot(db, farmId)).toEqual(before);
	});

	it('refuses a file over 1 MB, a file with other columns and one that is not CSV', async () => {
		const before = await farmSnapshot(db, farmId);
		const big = `${header}\n${'Big,1,1,,owned,0,padding\n'.repeat(45_000)}`;
		expect(big.length).toBeGreaterThan(1_000_000);
		const cases: [Promise<Response>, string][] = [
			[upload(owner, big), 'a CSV upload is at most 1 MB'],
			[upload(owner, 'field,size\nNorth,40\n'), 'The columns do not match the template'],
			[
				upload(owner, new Uint8Array([0x50, 0x4b, 3, 4, 0]), 'fields.xlsx', 'application/zip'),
				'That is not a CSV file'
			]
		];
		for (const [response, message] of cases) {
			const answer = await response;
			expect(answer.status).toBe(400);
			expect(await answer.text()).toContain(message);
		}
		expect(await farmSnapshot(db, farmId)).toEqual(before);
	});

	it('offers a template with the columns and an example row', async () => {
		const response = await owner.fetch(`${page()}/template.csv`);
		expect(response.status).toBe(200);
		expect(response.headers.get('content-type')).toBe('text/csv; charset=utf-8');
		const [head, example] = (await response.text()).split('\r\n');
		expect(head.split(',')).toEqual(expect.arrayContaining(header.split(',')));
		expect(example).toContain('North Forty');
	});
});

describe('uploading prices', () => {
	const pricesHeader =
		'year,nitrogenUsdPerLb,dieselUsdPerGallon,labourUsdPerHour,hayUsdPerBale,crop:corn,crop:soybean';
	const uploadPrices = (content: string) => {
		const body = new FormData();
		body.append('file', new File([content], 'prices.csv', { type: 'text/csv' }));
		return owner.fetch(`/farms/${farmId}/upload/price-sets?/preview`, {
			method: 'POST',
			body,
			headers: { Accept: 'text/html' }
		});
	};

	it('imports a year a row; a crop the farm lacks or a year it has is named by row and column', async () => {
		const good = `${pricesHeader}\n2027,0.55,3.6,22,60,4.4,10.6\n2028,0.57,3.7,23,62,4.5,10.8\n`;
		const csv = readyCsv(await (await uploadPrices(good)).text());
		expect(csv).toBe(good);
		const response = await owner.postForm(`/farms/${farmId}/upload/price-sets?/import`, {
			csv: csv!
		});
		expect(response.headers.get('location')).toBe(`/farms/${farmId}/prices?imported=2`);
		const listed = await (await owner.fetch(`/api/v1/farms/${farmId}/price-sets`)).json();
		expect(listed.priceSets.map((set: { year: number }) => set.year)).toEqual([2027, 2028]);

		const before = await farmSnapshot(db, farmId);
		const bad = `${pricesHeader},crop:quinoa\n2028,0.5,3,20,50,4,10,7\n2029,0.5,3,20,50,4,10,7\n`;
		const refused = await uploadPrices(bad);
		expect(refused.status).toBe(400);
		const html = await refused.text();
		expect(html).toMatch(/data-problem-row="2"[^]*?year[^]*?already has prices for 2028/);
		expect(html).toMatch(/data-problem-row="3"[^]*?crop:quinoa[^]*?no crop "quinoa"/);
		expect(await farmSnapshot(db, farmId)).toEqual(before);
	});
});

describe('uploading operations', () => {
	const opsHeader =
		'name,key,by,month,statedAs,speedMph,widthFt,fieldEfficiencyPercent,fuelBasis,dieselGallonsPerAcre,labourFactor,repairsUsdPerAcre,machineHoursPerAcre,labourHoursPerAcre';

	it('imports own and hired passes; a key the farm has is named by its row', async () => {
		const good = `${opsHeader}\nDisk,disk,own,4,machine,6,24,80,per-acre,0.75,1.1,2,,\nHired combining,hired-combine,custom,10,,,,,,,,,,\n`;
		const body = new FormData();
		body.append('file', new File([good], 'operations.csv', { type: 'text/csv' }));
		const preview = await owner.fetch(`/farms/${farmId}/upload/operations?/preview`, {
			method: 'POST',
			body,
			headers: { Accept: 'text/html' }
		});
		const csv = readyCsv(await preview.text());
		expect(csv).toBe(good);
		const response = await owner.postForm(`/farms/${farmId}/upload/operations?/import`, {
			csv: csv!
		});
		expect(response.headers.get('location')).toBe(`/farms/${farmId}/operations?imported=2`);

		const before = await farmSnapshot(db, farmId);
		const again = await owner.postForm(`/farms/${farmId}/upload/operations?/import`, {
			csv: `${opsHeader}\nDisk again,disk,own,4,machine,6,24,80,per-acre,0.75,1.1,2,,\n`
		});
		expect(again.status).toBe(400);
		expect(await again.text()).toMatch(/data-problem-row="2"[^]*?key[^]*?has the key "disk"/);
		expect(await farmSnapshot(db, farmId)).toEqual(before);
	});
});

describe('a reviewer', () => {
	it('gets no upload page and may not post an import', async () => {
		const reviewer = await reviewerOf(db, farmId, 'uploads-reviewer');
		const before = await farmSnapshot(db, farmId);
		expect((await reviewer.fetch(page(), { headers: { Accept: 'text/html' } })).status).toBe(403);
		const csv = `${header}\nSneaky,5,1,,owned,0,\n`;
		expect((await reviewer.postForm(`${page()}?/import`, { csv })).status).toBe(403);
		expect(await farmSnapshot(db, farmId)).toEqual(before);
	});
});
