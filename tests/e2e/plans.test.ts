// The plans pages in Chromium on a farm of the test's own made from the demo's reference plan file (the
// seeded demo stays as it was): import a plan file, copy the reference plan, watch the results change
// as a field's rotation changes, save, reload, restore an older version, compare with the reference
// plan, and refuse a malformed file. Screenshots at phone and desktop width.
import { readFile, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
	checkBothWidths,
	freshPage,
	openPath,
	sharedBrowser,
	useSession
} from '../support/browser';
import { testDb } from '../support/db';
import { farmFromScenario } from '../support/farms';
import { baseUrl } from '../support/server';

const db = testDb();
let context: BrowserContext;
let release: () => Promise<void>;
let plansPath: string;

beforeAll(async () => {
	({ context, release } = await sharedBrowser());
	const { owner, farmId } = await farmFromScenario(db, 'scenarios/reference.json', 'plans-e2e');
	await useSession(
		context,
		owner.cookieList().map((cookie) => ({ ...cookie, url: baseUrl }))
	);
	plansPath = `/farms/${farmId}/plans`;
});
afterAll(() => release());

/** The whole-farm table's net return row as printed, every year. */
const netReturns = (page: Page) => page.locator('tr[data-row="netReturn"]').textContent();

/** Waits for the live results to answer once more after `change`, and returns the new figure. */
async function afterResults(page: Page, change: () => Promise<unknown>) {
	const before = await netReturns(page);
	await change();
	await expect.poll(() => netReturns(page)).not.toBe(before);
	return netReturns(page);
}

async function openNewCopy(page: Page, name: string) {
	await openPath(page, plansPath);
	await page.getByLabel('Name of the new plan').fill(name);
	await page.getByRole('button', { name: 'Make the copy' }).click();
	await page.waitForURL(/\/plans\/[0-9a-f-]{36}$/);
	await page.locator('tr[data-row="netReturn"] td').first().waitFor();
}

describe('an owner', () => {
	it('imports a plan file and lands on its editor with its results', async () => {
		const page = await freshPage(context);
		await openPath(page, plansPath);
		await page
			.getByLabel('Plan file', { exact: true })
			.setInputFiles('scenarios/small-grain-peas.json');
		await page.getByRole('button', { name: 'Import' }).click();
		await page.waitForURL(/\/plans\/[0-9a-f-]{36}$/);
		await expect.poll(() => page.locator('tr[data-row="netReturn"] td').count()).toBe(5);
		await openPath(page, plansPath);
		expect(await page.locator('[data-plan]').count()).toBe(2);
	});

	it('refuses a malformed plan file, naming each bad value, and saves nothing', async () => {
		const page = await freshPage(context);
		const bad = JSON.parse(await readFile('scenarios/reference.json', 'utf8'));
		bad.fields[0].acres = -5;
		bad.plan.fieldRotations[0].rotationId = 'no-such-rotation';
		const file = join(tmpdir(), `bad-plan-${crypto.randomUUID()}.json`);
		await writeFile(file, JSON.stringify(bad));
		await openPath(page, plansPath);
		const before = await page.locator('[data-plan]').count();
		await page.getByLabel('Plan file', { exact: true }).setInputFiles(file);
		await page.getByRole('button', { name: 'Import' }).click();
		const issues = page.getByTestId('import-issues');
		await expect.poll(() => issues.textContent()).toContain('fields.0.acres');
		expect(await issues.textContent()).toContain('plan.fieldRotations.0.rotationId');
		await openPath(page, plansPath);
		expect(await page.locator('[data-plan]').count()).toBe(before);
	});

	it('builds a plan: the results follow a changed rotation, and it saves, reloads and restores', async () => {
		const page = await freshPage(context);
		await openNewCopy(page, 'Trial: Big Bend to small grain');
		const field = page.locator('tr[data-field="big-bend"]');
		const rotation = field.getByLabel('Rotation of Big Bend');
		const original = await rotation.inputValue();
		const choices = await rotation
			.locator('option')
			.evaluateAll((options) => options.map((o) => (o as HTMLOptionElement).value).filter(Boolean));
		const other = choices.find((value) => value !== original)!;

		const changed = await afterResults(page, () => rotation.selectOption(other));
		expect(changed).not.toBeNull();
		expect(await page.getByText('unsaved changes').count()).toBe(1);

		// The partial budget against the reference plan now shows a change, on average over the years.
		await page.getByRole('tab', { name: 'Partial budget' }).click();
		expect(new URL(page.url()).searchParams.get('tab')).toBe('budget');
		const netChange = await page.getByTestId('net-change').last().textContent();
		expect(netChange).not.toBe('$0');

		await page.getByLabel('Note on this version').fill('Big Bend tries the small-grain rotation');
		await page.getByRole('button', { name: 'Save as a new version' }).click();
		await page.getByText('Saved as version 2.').waitFor();
		await page.reload();
		expect(await page.getByLabel('Rotation of Big Bend').inputValue()).toBe(other);
		expect(await page.getByText('Version 2 of 2').count()).toBe(1);

		// Version 1 restored is version 3, with Big Bend's rotation as it was.
		await page.getByRole('tab', { name: 'Versions' }).click();
		expect(await page.locator('tr[data-version]').count()).toBe(2);
		await page.getByRole('button', { name: 'Restore version 1' }).click();
		await page.getByText('Saved as version 3.').waitFor();
		expect(await page.getByLabel('Rotation of Big Bend').inputValue()).toBe(original);
		expect(await page.locator('tr[data-version="3"]').textContent()).toContain(
			'Restored version 1'
		);
	});

	it('compares the plans with the reference plan, each with its partial budget', async () => {
		const page = await freshPage(context);
		await openPath(page, plansPath);
		for (const box of await page.getByRole('checkbox', { name: /^Compare / }).all()) {
			await box.check();
		}
		await page.getByRole('link', { name: /^Compare \d plans$/ }).click();
		await page.waitForURL(/\/compare\?plans=/);
		const budgets = page.getByTestId('partial-budget');
		expect(await budgets.count()).toBe(
			(await page.locator('input[name=plans]:checked').count()) - 1
		);
	});

	it('shows a usable editor at phone and desktop width', async () => {
		const page = await freshPage(context);
		await openPath(page, plansPath);
		await page.locator('[data-plan] a').first().click();
		await page.locator('tr[data-row="netReturn"] td').first().waitFor();
		await checkBothWidths(page, 'plan-editor', {
			targets: true,
			// The field names stay in view while the grid scrolls sideways.
			atEach: async () => {
				const grid = page.getByTestId('plan-grid');
				await grid.evaluate((box) => (box.scrollLeft = box.scrollWidth));
				const gridBox = (await grid.boundingBox())!;
				const nameBox = (await page.locator('tr[data-field] th').first().boundingBox())!;
				expect(nameBox.x).toBeGreaterThanOrEqual(gridBox.x - 1);
			}
		});
	});
});
