// The practices and rotations pages: forms that work without JavaScript (plain POSTs of repeated
// inputs), messages beside their inputs, and no forms for a reviewer, whose posts get 403.
import { and, asc, eq } from 'drizzle-orm';
import { beforeAll, describe, expect, it } from 'vitest';
import {
	cropPractices,
	practiceOperations,
	rotations,
	rotationSteps
} from '../../src/lib/server/db/schema';
import { testDb } from '../support/db';
import type { Client } from '../support/http';
import { farmSnapshot, importReferencePlan, ownFarm, reviewerOf } from './farm-setup-support';

const db = testDb();
const html = { headers: { Accept: 'text/html' } };

let owner: Client;
let farmId: string;
let planName: string;

// What the new-practice form posts without JavaScript: empty rows are left out.
const cornForm = {
	name: 'Corn at the optimum',
	crop: 'corn',
	yieldGoalPerAcre: '190',
	yieldAdjustmentPercent: '0',
	rowSpacingIn: '30',
	seedId: 'corn-seed',
	seedRateBasis: 'seedsPerAcre',
	seedRate: '34000',
	nitrogenMode: 'economic-optimum',
	nitrogenAppliedLbPerAcre: '0',
	hasResponse: 'on',
	responseInterceptBuPerAcre: '115',
	responseLinearBuPerLbN: '0.85',
	responseQuadraticBuPerLbN2: '0.0025',
	nitrogenCreditToNextCropLbPerAcre: '0',
	otherFertiliserUsdPerAcre: '40',
	chemicalsUsdPerAcre: '35',
	otherDirectUsdPerAcre: '0',
	operatingInterestMonths: '6',
	operationKey: ['no-till-planter', '', 'combine-corn'],
	operationMonth: ['0', '0', '11'],
	operationPasses: ['1', '1', '1'],
	coverSeedId: ['cereal-rye', ''],
	coverLbPerAcre: ['40', ''],
	coverBiomassLbDmPerAcre: '800',
	coverLegumeSharePercent: '0',
	coverLegumeNitrogenPercent: '3.5',
	coverNitrogenAvailablePercent: '50',
	coverGrazingUtilisationPercent: '0',
	residueLeafHuskLbDmPerUnit: '',
	residueUtilisationPercent: '50'
};

const practiceRow = (name: string) =>
	db
		.select()
		.from(cropPractices)
		.where(and(eq(cropPractices.farmId, farmId), eq(cropPractices.name, name)))
		.then((rows) => rows[0]);

const mainOf = (page: string) => page.split('<main')[1].split('</main>')[0];

beforeAll(async () => {
	({ owner, farmId } = await ownFarm('practice-pages'));
	planName = (await importReferencePlan(db, farmId)).plan.name;
});

describe('the practice form without JavaScript', () => {
	it('adds a practice with its operations in order and a cover; the list shows it by crop name', async () => {
		const response = await owner.postForm(`/farms/${farmId}/practices/new?/create`, {
			...cornForm,
			hasCover: 'on'
		});
		expect(response.status).toBe(303);
		expect(response.headers.get('location')).toBe(
			`/farms/${farmId}/practices?added=corn-at-the-optimum`
		);
		const row = await practiceRow('Corn at the optimum');
		expect(row).toMatchObject({ crop: 'corn', yieldGoalPerAcre: 190, chemicalsUsdPerAcre: 35 });
		expect(row.detail).toMatchObject({
			seed: { seedId: 'corn-seed', seedsPerAcre: 34000 },
			nitrogen: { appliedLbPerAcre: 'economic-optimum' },
			coverMix: { species: [{ seedId: 'cereal-rye', lbPerAcre: 40 }], biomassLbDmPerAcre: 800 },
			residueGrazing: null
		});
		const steps = await db
			.select({ sequence: practiceOperations.sequence, month: practiceOperations.month })
			.from(practiceOperations)
			.where(eq(practiceOperations.practiceId, row.id))
			.orderBy(asc(practiceOperations.sequence));
		expect(steps).toEqual([
			{ sequence: 1, month: null },
			{ sequence: 2, month: 11 }
		]);
		const list = await (await owner.fetch(`/farms/${farmId}/practices`, html)).text();
		expect(list).toMatch(
			/data-practice="Corn at the optimum"[^]*?Corn<[^]*?190 bu[^]*?economic optimum[^]*?cereal rye 40/
		);
		expect(list).toContain('Rates must follow local regulations');
	});

	it('an N curve on soybean and an unknown operation come back beside their inputs; nothing saved', async () => {
		const before = await farmSnapshot(db, farmId);
		const response = await owner.postForm(`/farms/${farmId}/practices/new?/create`, {
			...cornForm,
			name: 'Soybean with a curve',
			crop: 'soybean',
			yieldGoalPerAcre: '55',
			nitrogenMode: 'rate',
			operationKey: ['plough', 'combine-soybean'],
			operationMonth: ['0', '0'],
			operationPasses: ['1', '1']
		});
		expect(response.status).toBe(400);
		const page = await response.text();
		expect(page).toMatch(/data-error-for="hasResponse"[^>]*>\s*Soybean is a legume/);
		expect(page).toMatch(/data-error-for="operationKey\[0\]"[^>]*>\s*Unknown operation "plough"/);
		expect(page).toContain('value="Soybean with a curve"');
		expect(await farmSnapshot(db, farmId)).toEqual(before);
	});

	it('edits a practice: a rate instead of the optimum, an operation taken out', async () => {
		const row = await practiceRow('Corn at the optimum');
		const form = await (await owner.fetch(`/farms/${farmId}/practices/${row.id}`, html)).text();
		expect(form).toContain('N figures are estimates only.');
		expect(form).toContain('The curve levels off at 170 lb N/ac available');
		const response = await owner.postForm(`/farms/${farmId}/practices/${row.id}?/update`, {
			...cornForm,
			nitrogenMode: 'rate',
			nitrogenAppliedLbPerAcre: '150',
			operationKey: ['', 'combine-corn'],
			operationMonth: ['0', '0'],
			operationPasses: ['1', '1']
		});
		expect(response.status).toBe(303);
		const saved = await practiceRow('Corn at the optimum');
		expect(saved.id).toBe(row.id);
		expect(saved.detail.nitrogen.appliedLbPerAcre).toBe(150);
		expect(saved.detail.coverMix).toBeNull();
		const steps = await db
			.select()
			.from(practiceOperations)
			.where(eq(practiceOperations.practiceId, row.id));
		expect(steps).toHaveLength(1);
	});
});

describe('the rotations page', () => {
	it('adds a rotation from the year selects and shows it as a strip with its warning', async () => {
		const years = ['corn-30in-full-n', 'corn-30in-full-n', '', 'soybean-15in', '', '', '', ''];
		const response = await owner.postForm(`/farms/${farmId}/rotations?/create`, {
			name: 'Corn–corn–soybean',
			practice: years
		});
		expect(response.status).toBe(303);
		const [rotation] = await db
			.select()
			.from(rotations)
			.where(and(eq(rotations.farmId, farmId), eq(rotations.name, 'Corn–corn–soybean')));
		const steps = await db
			.select()
			.from(rotationSteps)
			.where(eq(rotationSteps.rotationId, rotation.id));
		expect(steps).toHaveLength(3);
		const page = await (await owner.fetch(`/farms/${farmId}/rotations`, html)).text();
		expect(page).toMatch(/data-rotation="Corn–corn–soybean"[^]*?data-year="3"[^]*?Soybean/);
		expect(page).toMatch(/data-rule="corn-after-corn"[^>]*>[^]*?Year 2:/);
	});

	it('a rotation with no years comes back with the message beside the years', async () => {
		const before = await farmSnapshot(db, farmId);
		const response = await owner.postForm(`/farms/${farmId}/rotations?/create`, {
			name: 'Nothing',
			practice: Array(8).fill('')
		});
		expect(response.status).toBe(400);
		expect(await response.text()).toMatch(
			/data-error-for="practice"[^>]*>\s*Give at least one practice: a rotation is 1 to 8 years./
		);
		expect(await farmSnapshot(db, farmId)).toEqual(before);
	});

	it('a rotation a plan uses: the delete page names the plan, the action refuses with 409', async () => {
		const [rotation] = await db
			.select()
			.from(rotations)
			.where(and(eq(rotations.farmId, farmId), eq(rotations.key, 'corn-soybean')));
		const ask = await (
			await owner.fetch(`/farms/${farmId}/rotations/${rotation.id}?confirm=delete`, html)
		).text();
		expect(ask).toContain(`Corn–soybean is in the plan "${planName}"`);
		expect(ask).not.toContain('Delete rotation</button>');
		const before = await farmSnapshot(db, farmId);
		const result = await owner.action(`/farms/${farmId}/rotations/${rotation.id}?/delete`, {});
		expect(result).toMatchObject({ type: 'failure', status: 409 });
		expect(await farmSnapshot(db, farmId)).toEqual(before);
	});
});

describe('a reviewer', () => {
	it('reads the practices and rotations with no forms, and may not post to them', async () => {
		const reviewer = await reviewerOf(db, farmId, 'practice-pages-reviewer');
		const row = await practiceRow('Corn at the optimum');
		const list = await (await reviewer.fetch(`/farms/${farmId}/practices`, html)).text();
		expect(list).toContain('Corn at the optimum');
		expect(list).not.toContain('Add a practice');
		const one = await reviewer.fetch(`/farms/${farmId}/practices/${row.id}`, html);
		expect(one.status).toBe(200);
		const onePage = await one.text();
		expect(onePage).toContain('150 lb N/ac');
		expect(mainOf(onePage)).not.toContain('<form');
		const rotationsPage = await (await reviewer.fetch(`/farms/${farmId}/rotations`, html)).text();
		expect(rotationsPage).toContain('Corn–soybean');
		expect(mainOf(rotationsPage)).not.toContain('<form');
		expect(mainOf(rotationsPage)).not.toContain('Edit');

		const before = await farmSnapshot(db, farmId);
		const posts = [
			reviewer.postForm(`/farms/${farmId}/practices/new?/create`, cornForm),
			reviewer.postForm(`/farms/${farmId}/practices/${row.id}?/update`, cornForm),
			reviewer.postForm(`/farms/${farmId}/practices/${row.id}?/delete`, {}),
			reviewer.postForm(`/farms/${farmId}/rotations?/create`, {
				name: 'Mine',
				practice: ['soybean-15in']
			})
		];
		for (const response of await Promise.all(posts)) expect(response.status).toBe(403);
		expect((await reviewer.fetch(`/farms/${farmId}/practices/new`, html)).status).toBe(403);
		expect(await farmSnapshot(db, farmId)).toEqual(before);
	});
});
