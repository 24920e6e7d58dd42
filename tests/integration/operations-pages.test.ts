// The operations pages: copying a catalogue default and saving the form without JavaScript (plain
// POSTs), in the farm's own units, and no edit controls (and 403 for posts) for a reviewer.
import { and, eq } from 'drizzle-orm';
import { beforeAll, describe, expect, it } from 'vitest';
import { fieldOperations } from '../../src/lib/server/db/schema';
import { testDb } from '../support/db';
import type { Client } from '../support/http';
import { farmSnapshot, ownFarm, reviewerOf } from './farm-setup-support';

const db = testDb();
const html = { headers: { Accept: 'text/html' } };

let owner: Client;
let farmId: string;

const operationRow = (farm: string, key: string) =>
	db
		.select()
		.from(fieldOperations)
		.where(and(eq(fieldOperations.farmId, farm), eq(fieldOperations.key, key)))
		.then((rows) => rows[0]);

// A planter by its machine: ASABE D497 row-crop planter 5.5 mph, 65 % (from memory), 30 ft →
// 5.5 × 30 × 0.65 ÷ 8.25 = 13.0 ac/h; Univ. of Missouri G1208 no-till planter 0.35 gal/ac.
const planterForm = {
	name: 'Our no-till planter',
	month: '5',
	kind: 'machine',
	speed: '5.5',
	width: '30',
	fieldEfficiencyPercent: '65',
	fuelBasis: 'per-acre',
	dieselPerArea: '0.35',
	labourFactor: '1.1',
	repairsPerArea: '4.5'
};

beforeAll(async () => {
	({ owner, farmId } = await ownFarm('operations-pages'));
});

describe('the operations page without JavaScript', () => {
	it('copies a catalogue default and lists it with the source of its numbers', async () => {
		const response = await owner.postForm(`/farms/${farmId}/operations?/copy`, {
			default: 'nh3-applicator'
		});
		expect(response.status).toBe(303);
		expect(response.headers.get('location')).toBe(
			`/farms/${farmId}/operations?copied=nh3-applicator#farm-operations`
		);
		expect(await operationRow(farmId, 'nh3-applicator')).toMatchObject({
			copiedFrom: 'nh3-applicator',
			speedMph: 6,
			widthFt: 37.5,
			fieldEfficiencyPercent: 65,
			dieselGallonsPerAcre: 0.65
		});
		const page = await (await owner.fetch(`/farms/${farmId}/operations`, html)).text();
		// ISU A3-24 Table 1: 15 knives, 6 mph, 65 % → 17.7 ac/h; 100 ÷ 17.7 = 5.6 h per 100 acres
		expect(page).toMatch(
			/data-operation="Anhydrous applicator, 15 knives at 30 in"[^]*?17\.7[^]*?5\.6[^]*?0\.65[^]*?ISU A3-24 Table 1/
		);
	});

	it('adds an operation by its machine and shows its capacity', async () => {
		const response = await owner.postForm(`/farms/${farmId}/operations?/create`, planterForm);
		expect(response.status).toBe(303);
		expect(await operationRow(farmId, 'our-no-till-planter')).toMatchObject({
			by: 'own',
			statedAs: 'machine',
			speedMph: 5.5,
			widthFt: 30,
			fuelBasis: 'per-acre',
			dieselGallonsPerAcre: 0.35,
			machineHoursPerAcre: null,
			copiedFrom: null
		});
		const page = await (await owner.fetch(`/farms/${farmId}/operations`, html)).text();
		expect(page).toMatch(/data-operation="Our no-till planter"[^]*?13\.0[^]*?7\.7/);
	});

	it('a bad value comes back beside its input, a missing one too, and nothing is saved', async () => {
		const before = await farmSnapshot(db, farmId);
		const response = await owner.postForm(`/farms/${farmId}/operations?/create`, {
			...planterForm,
			name: 'Typo planter',
			fieldEfficiencyPercent: '150',
			width: ''
		});
		expect(response.status).toBe(400);
		const page = await response.text();
		expect(page).toMatch(
			/data-error-for="fieldEfficiencyPercent"[^>]*>\s*The field efficiency must be at most 100 %.\s*</
		);
		expect(page).toMatch(/data-error-for="width"[^>]*>\s*Enter the working width as a number.\s*</);
		expect(page).toContain('value="Typo planter"');
		expect(await farmSnapshot(db, farmId)).toEqual(before);
	});

	it('changes an operation to hired on its own page, clearing the machine', async () => {
		const row = await operationRow(farmId, 'our-no-till-planter');
		const form = await (await owner.fetch(`/farms/${farmId}/operations/${row.id}`, html)).text();
		expect(form).toContain('value="5.5"');
		const response = await owner.postForm(`/farms/${farmId}/operations/${row.id}?/update`, {
			name: 'Planting, hired',
			month: '5',
			kind: 'custom',
			fuelBasis: 'per-acre',
			// A value left in an input a hired pass does not use is not checked or saved.
			fieldEfficiencyPercent: '150'
		});
		expect(response.status).toBe(303);
		expect(await operationRow(farmId, 'our-no-till-planter')).toMatchObject({
			id: row.id,
			name: 'Planting, hired',
			by: 'custom',
			statedAs: null,
			speedMph: null,
			dieselGallonsPerAcre: null
		});
	});
});

describe('a metric farm', () => {
	it('takes speed in km/h and width in m, stores mph and ft, and shows ha/h', async () => {
		const { owner: metricOwner, farmId: metricFarm } = await ownFarm('operations-metric', 'metric');
		const response = await metricOwner.postForm(`/farms/${metricFarm}/operations?/create`, {
			...planterForm,
			name: 'Metric planter',
			speed: '8',
			width: '9',
			dieselPerArea: '3.3',
			repairsPerArea: '11'
		});
		expect(response.status).toBe(303);
		// NIST SP 811: 1 mi = 1.609344 km, 1 ft = 0.3048 m; 8 km/h = 4.97 mph, 9 m = 29.53 ft;
		// 3.3 L/ha = 0.353 gal/ac (× 9.354, REFERENCE-VALUES §2).
		expect(await operationRow(metricFarm, 'metric-planter')).toMatchObject({
			speedMph: 4.97,
			widthFt: 29.53,
			dieselGallonsPerAcre: 0.353
		});
		const page = await (await metricOwner.fetch(`/farms/${metricFarm}/operations`, html)).text();
		expect(page).toContain('Field capacity (ha/h)');
		// Srivastava et al. eq. 15.1: 8 km/h × 9 m × 0.65 ÷ 10 = 4.7 ha/h
		expect(page).toMatch(/data-operation="Metric planter"[^]*?4\.7/);
	});
});

describe('a reviewer', () => {
	it('sees the operations and the catalogue with no forms or buttons, and a post gets 403', async () => {
		const reviewer = await reviewerOf(db, farmId, 'operations-pages-reviewer');
		const list = await (await reviewer.fetch(`/farms/${farmId}/operations`, html)).text();
		expect(list).toContain('Anhydrous applicator, 15 knives at 30 in');
		expect(list).toContain('ISU A3-24 Table 1');
		// The layout's sign-out form is the page's only form.
		expect(list.match(/<form/g)).toHaveLength(1);
		expect(list).not.toContain('Copy to my farm');
		expect(list).not.toContain('name="kind"');
		const row = await operationRow(farmId, 'nh3-applicator');
		const detail = await (
			await reviewer.fetch(`/farms/${farmId}/operations/${row.id}`, html)
		).text();
		expect(detail).toMatch(/Field capacity \(ac\/h\)[^]*?17\.7/);
		expect(detail.match(/<form/g)).toHaveLength(1);
		expect(detail).not.toContain('Save operation');
		const before = await farmSnapshot(db, farmId);
		const copy = await reviewer.postForm(`/farms/${farmId}/operations?/copy`, {
			default: 'chisel-plow'
		});
		expect(copy.status).toBe(403);
		const update = await reviewer.postForm(`/farms/${farmId}/operations/${row.id}?/update`, {
			...planterForm
		});
		expect(update.status).toBe(403);
		const remove = await reviewer.postForm(`/farms/${farmId}/operations/${row.id}?/delete`, {});
		expect(remove.status).toBe(403);
		expect(await farmSnapshot(db, farmId)).toEqual(before);
	});
});
