// The prices pages: a year's prices added, changed and copied by forms that work without JavaScript,
// shown in the farm's units, and no edit controls (and 403 for posts) for a reviewer.
import { and, eq } from 'drizzle-orm';
import { beforeAll, describe, expect, it } from 'vitest';
import { priceSets } from '../../src/lib/server/db/schema';
import { testDb } from '../support/db';
import type { Client } from '../support/http';
import { farmSnapshot, ownFarm, reviewerOf } from './farm-setup-support';

const db = testDb();
const html = { headers: { Accept: 'text/html' } };
const builtInCropIds = [
	'corn',
	'soybean',
	'wheat',
	'oats',
	'barley',
	'rye',
	'oat-pea-forage',
	'hay'
];

/** Every input of the form as a browser posts it: crops left empty, two blank seed rows. */
function formFields(values: Record<string, string>) {
	return {
		year: '',
		nitrogenUsdPerLb: '',
		dieselUsdPerGallon: '',
		labourUsdPerHour: '',
		hayUsdPerBale: '',
		...Object.fromEntries(builtInCropIds.map((id) => [`crop_${id}`, ''])),
		...Object.fromEntries(
			[0, 1].flatMap((row) => [
				[`seed_${row}_id`, ''],
				[`seed_${row}_usdPerThousandSeeds`, ''],
				[`seed_${row}_usdPerLb`, '']
			])
		),
		...values
	};
}

const prices2027 = formFields({
	year: '2027',
	nitrogenUsdPerLb: '0.55',
	dieselUsdPerGallon: '3.60',
	labourUsdPerHour: '18',
	hayUsdPerBale: '65',
	crop_corn: '4.40',
	crop_soybean: '10.60',
	seed_0_id: 'cereal-rye',
	seed_0_usdPerLb: '0.29'
});

const setRow = (farm: string, year: number) =>
	db
		.select()
		.from(priceSets)
		.where(and(eq(priceSets.farmId, farm), eq(priceSets.year, year)))
		.then((rows) => rows[0]);

let owner: Client;
let farmId: string;

beforeAll(async () => {
	({ owner, farmId } = await ownFarm('prices-pages'));
});

describe('the prices pages without JavaScript', () => {
	it('add a year and list it with its crop prices', async () => {
		const response = await owner.postForm(`/farms/${farmId}/prices?/create`, prices2027);
		expect(response.status).toBe(303);
		expect(response.headers.get('location')).toBe(`/farms/${farmId}/prices?added=2027`);
		const set = await setRow(farmId, 2027);
		expect(set).toMatchObject({
			nitrogenUsdPerLb: 0.55,
			dieselUsdPerGallon: 3.6,
			hayUsdPerBale: 65
		});
		const { priceSet } = await (
			await owner.fetch(`/api/v1/farms/${farmId}/price-sets/${set.id}`)
		).json();
		expect(priceSet).toMatchObject({
			cropPricesUsdPerUnit: { corn: 4.4, soybean: 10.6 },
			seedPrices: { 'cereal-rye': { usdPerLb: 0.29 } }
		});
		const page = await (await owner.fetch(`/farms/${farmId}/prices`, html)).text();
		expect(page).toContain('Corn ($/bu)');
		expect(page).toMatch(/data-year="2027"[^]*?4\.40[^]*?10\.60[^]*?0\.55[^]*?3\.60/);
	});

	it('a bad price comes back beside its input; a taken year beside the year; nothing saved', async () => {
		const before = await farmSnapshot(db, farmId);
		const negative = await owner.postForm(
			`/farms/${farmId}/prices?/create`,
			formFields({ ...prices2027, year: '2028', crop_corn: '-4', hayUsdPerBale: '' })
		);
		expect(negative.status).toBe(400);
		const page = await negative.text();
		expect(page).toMatch(
			/data-error-for="crop_corn"[^>]*>\s*The crop price must be at least \$0 per sale unit.\s*</
		);
		expect(page).toMatch(/data-error-for="hayUsdPerBale"[^>]*>\s*Enter the hay price as a number./);
		const taken = await owner.action(`/farms/${farmId}/prices?/create`, prices2027);
		expect(taken).toMatchObject({ type: 'failure', status: 409 });
		expect(taken.data).toContain('The farm already has prices for 2027');
		expect(await farmSnapshot(db, farmId)).toEqual(before);
	});

	it('change a year on its page, then copy it to the next year', async () => {
		const set = await setRow(farmId, 2027);
		const edit = await owner.fetch(`/farms/${farmId}/prices/${set.id}`, html);
		const editHtml = await edit.text();
		expect(editHtml).toContain('Corn, $ per bu');
		expect(editHtml).toContain('Oat–pea forage, $ per ton');
		expect(editHtml).toContain('value="cereal-rye"');
		// The edit page shows the saved seed row and two blank ones.
		const seedRows = formFields({
			seed_2_id: '',
			seed_2_usdPerThousandSeeds: '',
			seed_2_usdPerLb: ''
		});
		const saved = await owner.postForm(`/farms/${farmId}/prices/${set.id}?/update`, {
			...seedRows,
			...prices2027,
			hayUsdPerBale: '70',
			seed_1_id: 'corn-seed',
			seed_1_usdPerThousandSeeds: '3.50'
		});
		expect(saved.status).toBe(303);
		expect(await setRow(farmId, 2027)).toMatchObject({ id: set.id, hayUsdPerBale: 70 });

		const copy = await owner.postForm(`/farms/${farmId}/prices/${set.id}?/copy`, {});
		expect(copy.status).toBe(303);
		const next = await setRow(farmId, 2028);
		expect(copy.headers.get('location')).toBe(`/farms/${farmId}/prices/${next.id}?copied=2027`);
		expect(next).toMatchObject({ hayUsdPerBale: 70, nitrogenUsdPerLb: 0.55 });
		const again = await owner.postForm(`/farms/${farmId}/prices/${set.id}?/copy`, {});
		expect(again.status).toBe(409);
		expect(await again.text()).toContain('The farm already has prices for 2028');
	});
});

describe('a metric farm', () => {
	it('lists prices per tonne, kg and litre', async () => {
		const { owner: metricOwner, farmId: metricFarm } = await ownFarm('prices-metric', 'metric');
		const added = await metricOwner.postForm(`/farms/${metricFarm}/prices?/create`, prices2027);
		expect(added.status).toBe(303);
		const page = await (await metricOwner.fetch(`/farms/${metricFarm}/prices`, html)).text();
		expect(page).toContain('Corn ($/t)');
		expect(page).toContain('N ($/kg N)');
		expect(page).toContain('Diesel ($/L)');
		// NIST Handbook 44: 1 lb = 0.45359237 kg, 1 gal = 3.785411784 L; corn's legal bushel is 56 lb
		// (FCIC-25010). $4.40/bu ÷ (56 × 0.45359237 / 1000) t = $173.22/t; $0.55/lb = $1.21/kg;
		// $3.60/gal = $0.95/L.
		expect(page).toMatch(/data-year="2027"[^]*?173\.22[^]*?1\.21[^]*?0\.95/);
	});
});

describe('a reviewer', () => {
	it('reads the years and a year’s prices with no forms or buttons, and may not post', async () => {
		const set = await setRow(farmId, 2027);
		const reviewer = await reviewerOf(db, farmId, 'prices-pages-reviewer');
		const main = (page: string) => page.split('<main')[1].split('</main>')[0];
		const list = await reviewer.fetch(`/farms/${farmId}/prices`, html);
		expect(list.status).toBe(200);
		const listHtml = main(await list.text());
		expect(listHtml).toContain('data-year="2027"');
		expect(listHtml).not.toContain('<form');
		expect(listHtml).not.toContain('<button');
		const one = await reviewer.fetch(`/farms/${farmId}/prices/${set.id}`, html);
		expect(one.status).toBe(200);
		const oneHtml = main(await one.text());
		expect(oneHtml).toMatch(/Corn[^]*?4\.40[^]*?bu/);
		expect(oneHtml).toContain('cereal-rye');
		expect(oneHtml).not.toContain('<form');
		expect(oneHtml).not.toContain('<button');

		const before = await farmSnapshot(db, farmId);
		const url = `/farms/${farmId}/prices/${set.id}`;
		const create = formFields({ ...prices2027, year: '2035' });
		expect((await reviewer.postForm(`/farms/${farmId}/prices?/create`, create)).status).toBe(403);
		expect((await reviewer.postForm(`${url}?/update`, prices2027)).status).toBe(403);
		expect((await reviewer.postForm(`${url}?/copy`, {})).status).toBe(403);
		expect((await reviewer.postForm(`${url}?/delete`, {})).status).toBe(403);
		expect(await farmSnapshot(db, farmId)).toEqual(before);
	});
});
