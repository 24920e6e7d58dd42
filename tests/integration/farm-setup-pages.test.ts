// The fields and crops pages: forms that work without JavaScript (plain POSTs) and with it (the
// action answers `use:enhance` reads), in the farm's own units, and no edit controls for a reviewer.
import { and, eq } from 'drizzle-orm';
import { beforeAll, describe, expect, it } from 'vitest';
import { crops, fields } from '../../src/lib/server/db/schema';
import { testDb } from '../support/db';
import type { Client } from '../support/http';
import { farmSnapshot, importReferencePlan, ownFarm, reviewerOf } from './farm-setup-support';

const db = testDb();
const html = { headers: { Accept: 'text/html' } };

let owner: Client;
let farmId: string;

const fieldRow = (farm: string, key: string) =>
	db
		.select()
		.from(fields)
		.where(and(eq(fields.farmId, farm), eq(fields.key, key)))
		.then((rows) => rows[0]);

beforeAll(async () => {
	({ owner, farmId } = await ownFarm('pages'));
});

describe('the fields page without JavaScript', () => {
	it('adds a field and goes back to the list, which shows it with the totals', async () => {
		const response = await owner.postForm(`/farms/${farmId}/fields?/create`, {
			name: 'Schoolhouse Forty',
			area: '40',
			productivityIndex: '0.95',
			priorCrop: 'corn',
			notes: ''
		});
		expect(response.status).toBe(303);
		expect(response.headers.get('location')).toBe(
			`/farms/${farmId}/fields?added=schoolhouse-forty`
		);
		expect(await fieldRow(farmId, 'schoolhouse-forty')).toMatchObject({
			name: 'Schoolhouse Forty',
			acres: 40,
			productivityIndex: 0.95,
			priorCrop: 'corn'
		});
		const page = await (await owner.fetch(`/farms/${farmId}/fields`, html)).text();
		expect(page).toContain('Schoolhouse Forty');
		expect(page).toMatch(/data-testid="field-totals"[^]*?1 field[^]*?40\.00/);
	});

	it('a bad area comes back beside its input with what was typed, and nothing is saved', async () => {
		const before = await farmSnapshot(db, farmId);
		const response = await owner.postForm(`/farms/${farmId}/fields?/create`, {
			name: 'Typo Field',
			area: '-3',
			productivityIndex: '1',
			priorCrop: '',
			notes: ''
		});
		expect(response.status).toBe(400);
		const page = await response.text();
		expect(page).toMatch(
			/data-error-for="area"[^>]*>\s*Field area must be at least 0.01 acres.\s*</
		);
		expect(page).toContain('value="Typo Field"');
		expect(await farmSnapshot(db, farmId)).toEqual(before);
	});

	it('with JavaScript the same refusal is a 400 failure the form shows in place', async () => {
		const before = await farmSnapshot(db, farmId);
		const result = await owner.action(`/farms/${farmId}/fields?/create`, {
			name: '',
			area: '99999',
			productivityIndex: '1',
			priorCrop: '',
			notes: ''
		});
		expect(result).toMatchObject({ type: 'failure', status: 400 });
		expect(result.data).toContain('Field area must be at most 20,000 acres.');
		expect(result.data).toContain('Enter the field name.');
		expect(await farmSnapshot(db, farmId)).toEqual(before);
	});

	it('edits a field, keeping what the form does not show', async () => {
		const field = await fieldRow(farmId, 'schoolhouse-forty');
		const response = await owner.postForm(`/farms/${farmId}/fields/${field.id}?/update`, {
			name: 'Schoolhouse 40',
			area: '39.5',
			productivityIndex: '1',
			priorCrop: 'corn',
			notes: 'Waterway on the north side.'
		});
		expect(response.status).toBe(303);
		expect(await fieldRow(farmId, 'schoolhouse-forty')).toMatchObject({
			id: field.id,
			name: 'Schoolhouse 40',
			acres: 39.5,
			notes: 'Waterway on the north side.',
			priorCropNitrogenCreditLbPerAcre: field.priorCropNitrogenCreditLbPerAcre
		});
	});

	it('asks before deleting, then deletes', async () => {
		const field = await fieldRow(farmId, 'schoolhouse-forty');
		const ask = await (
			await owner.fetch(`/farms/${farmId}/fields/${field.id}?confirm=delete`, html)
		).text();
		expect(ask).toContain('Delete Schoolhouse 40?');
		const response = await owner.postForm(`/farms/${farmId}/fields/${field.id}?/delete`, {});
		expect(response.status).toBe(303);
		expect(await fieldRow(farmId, 'schoolhouse-forty')).toBeUndefined();
	});
});

describe('a metric farm', () => {
	it('shows and takes areas in hectares and stores acres', async () => {
		const { owner: metricOwner, farmId: metricFarm } = await ownFarm('pages-metric', 'metric');
		const response = await metricOwner.postForm(`/farms/${metricFarm}/fields?/create`, {
			name: 'Ten Hectares',
			area: '10',
			productivityIndex: '1',
			priorCrop: '',
			notes: ''
		});
		expect(response.status).toBe(303);
		// NIST SP 811: 1 ha = 10,000 m², 1 acre = 4,046.873 m² → 10 ha = 24.71 acres
		expect((await fieldRow(metricFarm, 'ten-hectares')).acres).toBe(24.71);
		const page = await (await metricOwner.fetch(`/farms/${metricFarm}/fields`, html)).text();
		expect(page).toContain('Area (ha)');
		expect(page).toMatch(/Ten Hectares[^]*?10\.00/);

		// The range is stated in hectares: 20,000 acres is 8,093.71 ha.
		const tooBig = await metricOwner.postForm(`/farms/${metricFarm}/fields?/create`, {
			name: 'Too Big',
			area: '9000',
			productivityIndex: '1',
			priorCrop: '',
			notes: ''
		});
		expect(tooBig.status).toBe(400);
		expect(await tooBig.text()).toContain('Field area must be at most 8,093.71 ha.');
	});

	it('takes cash rent per hectare and stores it per acre; the list reads owned and rented area', async () => {
		const { owner: metricOwner, farmId: metricFarm } = await ownFarm('pages-rent', 'metric');
		const response = await metricOwner.postForm(`/farms/${metricFarm}/fields?/create`, {
			name: 'Rented Flat',
			area: '20',
			productivityIndex: '1',
			tenure: 'cash-rented',
			cashRent: '600',
			priorCrop: '',
			notes: ''
		});
		expect(response.status).toBe(303);
		// NIST SP 811: 1 acre = 0.4046873 ha, so $600/ha × 0.4046873 = $242.81/ac
		expect(await fieldRow(metricFarm, 'rented-flat')).toMatchObject({
			tenure: 'cash-rented',
			cashRentUsdPerAcre: 242.81
		});
		const page = await (await metricOwner.fetch(`/farms/${metricFarm}/fields`, html)).text();
		expect(page).toMatch(
			/data-testid="tenure-summary"[^]*?0 ha<\/strong> owned[^]*?20 ha<\/strong> cash-rented/
		);

		const ownedWithRent = await metricOwner.postForm(`/farms/${metricFarm}/fields?/create`, {
			name: 'Home Block',
			area: '5',
			productivityIndex: '1',
			tenure: 'owned',
			cashRent: '100',
			priorCrop: '',
			notes: ''
		});
		expect(ownedWithRent.status).toBe(400);
		expect(await ownedWithRent.text()).toContain('An owned field pays no cash rent');
	});
});

describe('a field a plan uses', () => {
	it('the delete page names the plan and offers no delete button; the action refuses with 409', async () => {
		const { owner: planner, farmId: planFarm } = await ownFarm('pages-plan');
		const doc = await importReferencePlan(db, planFarm);
		const field = await fieldRow(planFarm, 'north-flat');
		const ask = await (
			await planner.fetch(`/farms/${planFarm}/fields/${field.id}?confirm=delete`, html)
		).text();
		expect(ask).toContain(`North Flat is in the plan "${doc.plan.name}"`);
		expect(ask).not.toContain('Delete field</button>');
		const before = await farmSnapshot(db, planFarm);
		const result = await planner.action(`/farms/${planFarm}/fields/${field.id}?/delete`, {});
		expect(result).toMatchObject({ type: 'failure', status: 409 });
		expect(result.data).toContain(doc.plan.name);
		expect(await farmSnapshot(db, planFarm)).toEqual(before);
	});
});

describe('the crops page', () => {
	it('lists the built-ins as built in and adds a crop of the farm’s own without JavaScript', async () => {
		const list = await (await owner.fetch(`/farms/${farmId}/crops`, html)).text();
		expect(list).toMatch(/data-crop="corn"[^]*?built in/);
		const response = await owner.postForm(`/farms/${farmId}/crops?/create`, {
			name: 'Sunflower',
			soldBy: 'cwt',
			lbPerUnit: '',
			residueLeafHuskLbDmPerUnit: ''
		});
		expect(response.status).toBe(303);
		const [row] = await db
			.select()
			.from(crops)
			.where(and(eq(crops.farmId, farmId), eq(crops.key, 'sunflower')));
		expect(row).toMatchObject({
			soldBy: 'cwt',
			lbPerUnit: 100,
			residueLeafHuskLbDmPerUnit: null,
			legume: false
		});
	});

	it('a bushel crop without its weight comes back with the message beside the weight', async () => {
		const before = await farmSnapshot(db, farmId);
		const response = await owner.postForm(`/farms/${farmId}/crops?/create`, {
			name: 'Flax',
			soldBy: 'bu',
			lbPerUnit: '',
			residueLeafHuskLbDmPerUnit: '',
			legume: 'on'
		});
		expect(response.status).toBe(400);
		expect(await response.text()).toMatch(
			/data-error-for="lbPerUnit"[^>]*>\s*Give the pounds in one bushel of Flax/
		);
		expect(await farmSnapshot(db, farmId)).toEqual(before);
	});

	it('a built-in crop has no edit page', async () => {
		const response = await owner.fetch(`/farms/${farmId}/crops/corn`, html);
		expect(response.status).toBe(409);
	});

	it('edits and deletes a crop of the farm’s own', async () => {
		const edit = await owner.postForm(`/farms/${farmId}/crops/sunflower?/update`, {
			name: 'Oil sunflower',
			soldBy: 'cwt',
			lbPerUnit: '100',
			residueLeafHuskLbDmPerUnit: '8'
		});
		expect(edit.status).toBe(303);
		const row = () =>
			db
				.select()
				.from(crops)
				.where(and(eq(crops.farmId, farmId), eq(crops.key, 'sunflower')))
				.then((rows) => rows[0]);
		expect(await row()).toMatchObject({ name: 'Oil sunflower', residueLeafHuskLbDmPerUnit: 8 });
		const gone = await owner.postForm(`/farms/${farmId}/crops/sunflower?/delete`, {});
		expect(gone.status).toBe(303);
		expect(await row()).toBeUndefined();
	});
});

describe('a reviewer', () => {
	it('sees the fields and crops pages with no edit controls, and may not post to them', async () => {
		const form = {
			name: 'Not Mine',
			area: '5',
			productivityIndex: '1',
			priorCrop: '',
			notes: ''
		};
		await owner.postForm(`/farms/${farmId}/fields?/create`, { ...form, name: 'Reviewed' });
		const field = await fieldRow(farmId, 'reviewed');
		const reviewer = await reviewerOf(db, farmId, 'pages-reviewer');
		const fieldsPage = await reviewer.fetch(`/farms/${farmId}/fields`, html);
		expect(fieldsPage.status).toBe(200);
		const fieldsHtml = await fieldsPage.text();
		expect(fieldsHtml).toContain('Reviewed');
		expect(fieldsHtml).not.toContain('Add a field');
		expect(fieldsHtml).not.toContain(`/fields/${field.id}`);
		// The only form on the page is the header's sign-out.
		expect(fieldsHtml.split('<main')[1].split('</main>')[0]).not.toContain('<form');
		const cropsHtml = await (await reviewer.fetch(`/farms/${farmId}/crops`, html)).text();
		expect(cropsHtml).toContain('built in');
		expect(cropsHtml).not.toContain('Add a crop');

		const before = await farmSnapshot(db, farmId);
		expect((await reviewer.postForm(`/farms/${farmId}/fields?/create`, form)).status).toBe(403);
		expect((await reviewer.fetch(`/farms/${farmId}/fields/${field.id}`, html)).status).toBe(403);
		const del = await reviewer.postForm(`/farms/${farmId}/fields/${field.id}?/delete`, {});
		expect(del.status).toBe(403);
		expect(await farmSnapshot(db, farmId)).toEqual(before);
	});
});
