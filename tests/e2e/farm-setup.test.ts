// The fields and crops pages in Chromium: a field added through the form (checked as the user leaves
// each input), a reviewer's read-only view, and screenshots at phone and desktop width.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { BrowserContext, Page } from 'playwright-core';
import {
	checkBothWidths,
	freshPage,
	openPath,
	screenshot,
	sharedBrowser,
	signInAs,
	viewports
} from '../support/browser';
import { demoUsers } from '../support/server';

let context: BrowserContext;
let release: () => Promise<void>;
let farmPath: string;

beforeAll(async () => {
	({ context, release } = await sharedBrowser());
	// A new account and farm of the test's own, made through the forms; the demo farm is only read.
	const page = await freshPage(context);
	await openPath(page, '/register');
	await page.getByLabel('Your name').fill('Fields Tester');
	await page
		.getByLabel('E-mail')
		.fill(`fields-e2e-${crypto.randomUUID().slice(0, 8)}@example.test`);
	await page.getByLabel('Password', { exact: true }).fill('fields-password');
	await page.getByLabel('Password again').fill('fields-password');
	await page.getByRole('button', { name: 'Create account' }).click();
	await page.waitForURL('**/farms');
	const formOpen = await page.locator('details').evaluate((d) => (d as HTMLDetailsElement).open);
	if (!formOpen) await page.getByText('New farm…').click();
	await page.getByLabel('Farm name').fill('Fields e2e farm');
	await page.getByRole('button', { name: 'Create farm' }).click();
	await page.waitForURL(/\/farms\/[0-9a-f-]{36}$/);
	farmPath = new URL(page.url()).pathname;
});
afterAll(() => release());

async function addField(page: Page, name: string, acres: string, key: string) {
	await page.getByLabel('Field name').fill(name);
	await page.getByLabel('Area (ac)').fill(acres);
	await page.getByRole('button', { name: 'Add field' }).click();
	await page.waitForURL((url) => url.searchParams.get('added') === key);
}

describe('an owner', () => {
	it('adds a field through the form; a slip is shown as soon as the user leaves the input', async () => {
		const page = await freshPage(context);
		await openPath(page, `${farmPath}/fields`);
		await page.getByLabel('Field name').fill('Creek Bottom');
		await page.getByLabel('Area (ac)').fill('-3');
		await page.getByLabel('Productivity index').focus();
		const error = page.locator('[data-error-for="area"]');
		await error.waitFor();
		await expect(error.textContent()).resolves.toContain('Field area must be at least 0.01 acres.');
		expect(page.url()).not.toContain('added');

		await page.getByLabel('Area (ac)').fill('22.5');
		await page.getByLabel('Productivity index').fill('1.1');
		await page.getByLabel('Prior crop').fill('soybean');
		await page.getByRole('button', { name: 'Add field' }).click();
		await page.waitForURL(/\?added=creek-bottom$/);
		await expect(page.getByRole('status').textContent()).resolves.toContain('Field added.');
		const row = page.locator('tr[data-field="Creek Bottom"]');
		await expect(row.locator('td').nth(1).textContent()).resolves.toBe('22.50');
		await expect(row.locator('td').nth(3).textContent()).resolves.toBe('soybean');
		await addField(page, 'Schoolhouse Forty', '40', 'schoolhouse-forty');
		await addField(
			page,
			'Home Quarter — west half with the old yard site',
			'78.25',
			'home-quarter-west-half-with-the-old-yard-site'
		);
		await expect(page.getByTestId('field-totals').textContent()).resolves.toMatch(
			/3 fields\s*140\.75/
		);
	});

	it('sorts the table by a heading, and back', async () => {
		const page = await freshPage(context);
		await openPath(page, `${farmPath}/fields`);
		await page.locator('a[data-sort="area"]').click();
		await page.waitForURL(/sort=area&dir=asc/);
		const names = () => page.locator('tbody tr td:first-child').allTextContents();
		// before the CSV upload adds its two fields
		await expect(names()).resolves.toEqual([
			'Creek Bottom',
			'Schoolhouse Forty',
			'Home Quarter — west half with the old yard site'
		]);
		await page.locator('a[data-sort="area"]').click();
		await page.waitForURL(/sort=area&dir=desc/);
		await expect(names()).resolves.toEqual([
			'Home Quarter — west half with the old yard site',
			'Schoolhouse Forty',
			'Creek Bottom'
		]);
	});

	it('uploads fields from a CSV: a bad row imports nothing and is shown; fixed, all rows import', async () => {
		const page = await freshPage(context);
		await openPath(page, `${farmPath}/fields`);
		await page.getByRole('link', { name: 'Upload fields from a CSV file' }).click();
		await page.waitForURL(/\/upload\/fields$/);
		const header = 'name,acres,productivityIndex,priorCrop,tenure,cashRentUsdPerAcre,notes';
		const rows = (hillAcres: string) =>
			`\uFEFF${header}\r\nRented Eighty,80,1,corn,cash-rented,240,\r\nHill Ten,${hillAcres},0.9,,owned,0,Steep\r\n`;
		const choose = (content: string) =>
			page.getByLabel('CSV file').setInputFiles({
				name: 'fields.csv',
				mimeType: 'text/csv',
				buffer: Buffer.from(content)
			});
		await choose(rows('-10'));
		await page.getByRole('button', { name: 'Check the file' }).click();
		const problem = page.locator('tr[data-problem-row="3"]');
		await problem.waitFor();
		await expect(problem.textContent()).resolves.toContain(
			'Field area must be at least 0.01 acres.'
		);
		await expect(page.getByRole('button', { name: /^Import/ }).count()).resolves.toBe(0);
		await checkBothWidths(page, 'fields-upload-problems');

		await choose(rows('10'));
		await page.getByRole('button', { name: 'Check the file' }).click();
		await page.getByRole('button', { name: 'Import 2 fields' }).click();
		await page.waitForURL(/\/fields\?imported=2$/);
		await expect(page.getByRole('status').textContent()).resolves.toMatch(/2\s+fields imported\./);
		await expect(page.getByTestId('field-totals').textContent()).resolves.toMatch(
			/5 fields\s*230\.75/
		);
		await expect(page.getByTestId('tenure-summary').textContent()).resolves.toMatch(
			/151 ac\s*owned · 80 ac\s*cash-rented, \$19,200 rent a\s+year/
		);
	});

	it('adds a crop of the farm’s own', async () => {
		const page = await freshPage(context);
		await openPath(page, `${farmPath}/crops`);
		await page.getByLabel('Crop name').fill('Grain sorghum');
		await page.getByLabel('Sold by the').selectOption('cwt');
		await page.getByRole('button', { name: 'Add crop' }).click();
		await page.waitForURL(/\?added=grain-sorghum$/);
		const row = page.locator('tr[data-crop="grain-sorghum"]');
		await expect(row.locator('td').nth(2).textContent()).resolves.toBe('100');
		await expect(page.locator('tr[data-crop="corn"]').textContent()).resolves.toContain('built in');
	});
});

describe('a reviewer (the demo lender)', () => {
	it('sees the demo farm’s fields with no edit controls', async () => {
		await context.clearCookies();
		const page = await freshPage(context);
		await signInAs(page, demoUsers.lender);
		await page.waitForURL('**/farms');
		await page.getByTestId('farm-list').getByText('Maple Coulee Farm').click();
		await page.waitForURL(/\/farms\/[0-9a-f-]{36}$/);
		await page.getByRole('link', { name: 'Fields page' }).click();
		await page.waitForURL(/\/fields$/);
		await expect(page.getByRole('cell', { name: 'North Flat' }).isVisible()).resolves.toBe(true);
		await expect(page.getByRole('heading', { name: 'Add a field' }).count()).resolves.toBe(0);
		await expect(page.getByRole('link', { name: /^Edit/ }).count()).resolves.toBe(0);
		await expect(page.locator('main form').count()).resolves.toBe(0);
		await openPath(page, page.url().replace(/fields$/, 'crops'));
		await expect(page.getByRole('heading', { name: 'Add a crop' }).count()).resolves.toBe(0);
		await context.clearCookies();
	});
});

// Each page loaded once at phone width and looked at in both widths by resizing it.
describe('at phone and desktop width', () => {
	it('the owner’s fields, field, delete and crops pages fit, with big enough targets', async () => {
		const page = await freshPage(context);
		await page.setViewportSize(viewports.phone);
		// An owner of its own, so the screenshots show the same two fields whatever ran before.
		await context.clearCookies();
		await openPath(page, '/register');
		await page.getByLabel('Your name').fill('Screens');
		await page
			.getByLabel('E-mail')
			.fill(`fields-shots-${crypto.randomUUID().slice(0, 8)}@example.test`);
		await page.getByLabel('Password', { exact: true }).fill('fields-password');
		await page.getByLabel('Password again').fill('fields-password');
		await page.getByRole('button', { name: 'Create account' }).click();
		await page.waitForURL('**/farms');
		const formOpen = await page.locator('details').evaluate((d) => (d as HTMLDetailsElement).open);
		if (!formOpen) await page.getByText('New farm…').click();
		await page.getByLabel('Farm name').fill('Shots');
		await page.getByRole('button', { name: 'Create farm' }).click();
		await page.waitForURL(/\/farms\/[0-9a-f-]{36}$/);
		const home = new URL(page.url()).pathname;
		await openPath(page, `${home}/fields`);
		await addField(page, 'North Forty', '40.5', 'north-forty');
		await addField(page, 'Creek Bottom', '22', 'creek-bottom');
		await page.getByLabel('Field name').fill('');
		await page.getByLabel('Area (ac)').fill('30000');
		await page.getByRole('button', { name: 'Add field' }).click();
		await page.locator('[data-error-for="area"]').waitFor();
		await page.locator('[data-error-for="name"]').waitFor();
		await checkBothWidths(page, 'fields-owner', { targets: true });

		await page.getByRole('link', { name: 'Edit North Forty' }).click();
		await page.waitForURL(/\/fields\/[0-9a-f-]{36}$/);
		await checkBothWidths(page, 'field-edit', { targets: true });
		await page.getByRole('link', { name: 'Delete…' }).click();
		await page.waitForURL(/confirm=delete$/);
		await checkBothWidths(page, 'field-delete');
		await page.getByRole('button', { name: 'Delete field' }).click();
		await page.waitForURL(/\/fields$/);
		await expect(page.locator('tr[data-field="North Forty"]').count()).resolves.toBe(0);

		await page.setViewportSize(viewports.phone);
		await openPath(page, `${home}/crops`);
		await page.getByLabel('Crop name').fill('Flax');
		await page.getByRole('button', { name: 'Add crop' }).click();
		// Sold by the bushel (the first choice) needs the bushel's weight: said before anything is sent.
		await page.locator('[data-error-for="lbPerUnit"]').waitFor();
		await page.getByLabel('Pounds per unit (lb)').fill('56');
		await page.getByRole('button', { name: 'Add crop' }).click();
		await page.waitForURL(/\?added=flax$/);
		await checkBothWidths(page, 'crops-owner', { targets: true });
		await page.getByRole('link', { name: 'Edit Flax' }).click();
		await page.waitForURL(/\/crops\/flax$/);
		await checkBothWidths(page, 'crop-edit', { targets: true });
		await page.getByRole('link', { name: 'Delete…' }).click();
		await page.waitForURL(/confirm=delete$/);
		await checkBothWidths(page, 'crop-delete');
		await context.clearCookies();
	});

	it('the demo farm’s fields for the reviewer: the first column stays in view as the table scrolls', async () => {
		await context.clearCookies();
		const page = await freshPage(context);
		await signInAs(page, demoUsers.lender);
		await page.waitForURL('**/farms');
		await page.getByTestId('farm-list').getByText('Maple Coulee Farm').click();
		await page.waitForURL(/\/farms\/[0-9a-f-]{36}$/);
		await openPath(page, `${new URL(page.url()).pathname}/fields`);
		const firstCell = page.getByRole('cell', { name: 'North Flat' });
		await checkBothWidths(page, 'fields-reviewer', {
			atEach: async (size) => {
				const before = await firstCell.boundingBox();
				const scrolled = await page.locator('table').evaluate((table) => {
					const box = table.parentElement!;
					box.scrollLeft = box.scrollWidth;
					return box.scrollLeft;
				});
				const after = await firstCell.boundingBox();
				// On a phone the table is wider than the window and scrolls; its first column does not move.
				if (size === 'phone') expect(scrolled).toBeGreaterThan(0);
				expect(after?.x).toBe(before?.x);
				await screenshot(page, `fields-reviewer-scrolled-${size}`);
				await page.locator('table').evaluate((table) => (table.parentElement!.scrollLeft = 0));
			}
		});
		await openPath(page, page.url().replace(/fields$/, 'crops'));
		await checkBothWidths(page, 'crops-reviewer');
		await context.clearCookies();
	});
});
