// The risk and cash-flow pages in Chromium on a farm of the test's own (the demo reference plan
// imported): the break-even and sensitivity figures shown are the API's (which integration tests hold
// equal to the engine's), the owner saves the farm's cash-flow settings and the peak loan shown follows.
// Screenshots at phone and desktop width; nothing sticks out of a phone's screen.
import type { BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { formatNumber, formatUsd } from '../../src/lib/format';
import { MONTH_NAMES } from '../../src/lib/months';
import {
	axeViolations,
	checkBothWidths,
	freshPage,
	openPath,
	sharedBrowser,
	useSession,
	viewports
} from '../support/browser';
import { testDb } from '../support/db';
import { farmFromScenario } from '../support/farms';
import type { Client } from '../support/http';
import { baseUrl } from '../support/server';

const db = testDb();
let context: BrowserContext;
let release: () => Promise<void>;
let owner: Client;
let planPath: string;
let apiPath: string;

beforeAll(async () => {
	({ context, release } = await sharedBrowser());
	const built = await farmFromScenario(db, 'scenarios/reference.json', 'risk-e2e');
	owner = built.owner;
	const plans = await owner.fetch(`/api/v1/farms/${built.farmId}/plans`);
	const planId = ((await plans.json()) as { plans: { id: string }[] }).plans[0].id;
	planPath = `/farms/${built.farmId}/plans/${planId}`;
	apiPath = `/api/v1/farms/${built.farmId}/plans/${planId}`;
	await useSession(
		context,
		owner.cookieList().map((cookie) => ({ ...cookie, url: baseUrl }))
	);
});
afterAll(() => release());

const text = async (page: Page, selector: string) =>
	((await page.locator(selector).first().textContent()) ?? '').replace(/\s+/g, ' ').trim();

/**
 * At phone width axe finds nothing; at phone and desktop width nothing sticks out and every target is
 * big enough, with a screenshot at each.
 */
async function lookAt(page: Page, name: string) {
	await page.setViewportSize(viewports.phone);
	expect(await axeViolations(page)).toEqual([]);
	await checkBothWidths(page, name, { targets: true });
}

describe('a lender’s view of a plan’s risk', () => {
	it('shows the break-even and sensitivity figures the API answers', async () => {
		const [breakEven, sensitivity] = await Promise.all([
			owner.fetch(`${apiPath}/break-even`).then((r) => r.json()),
			owner.fetch(`${apiPath}/sensitivity?steps=-15,15`).then((r) => r.json())
		]);
		const page = await freshPage(context);
		await page.setViewportSize(viewports.phone);
		await openPath(page, `${planPath}/risk?steps=-15,15`);
		expect(await text(page, '[data-testid="credit-caution"]')).toMatch(
			/credit decisions rest with the lender/i
		);

		const year = breakEven.breakEven.years[0];
		expect(await text(page, `tr[data-row="farm-${year.year}"] [data-cell="price-fall"]`)).toBe(
			formatNumber(year.farm.priceFallPercent, 1)
		);
		const corn = year.crops.find((c: { crop: string }) => c.crop === 'corn');
		const row = `tr[data-row="crop-${year.year}-corn"]`;
		expect(await text(page, `${row} [data-cell="break-even-price"]`)).toBe(
			`${formatUsd(corn.breakEvenPriceUsdPerUnit, 2)}/bu`
		);
		expect(await text(page, `${row} [data-cell="break-even-yield"]`)).toBe(
			`${formatNumber(corn.breakEvenYieldPerAcre, 1)} bu/ac`
		);

		// The chart's table, one click away: the largest row first, its figures the API's.
		await page.getByText('Show the table').click();
		const top = sensitivity.sensitivity.rows[0];
		const firstRow = page.locator('details tbody tr').first();
		expect(await text(page, 'details tbody tr th')).toBe(top.label);
		expect(await firstRow.locator('td').allTextContents()).toEqual(
			top.steps.map((s: { changeUsd: number }) => formatNumber(s.changeUsd))
		);
		expect(await page.locator('svg path.lc-bar').count()).toBeGreaterThan(0);
		await lookAt(page, 'risk');
	});

	it('saves the cash-flow settings and shows the peak loan that follows', async () => {
		const page = await freshPage(context);
		await page.setViewportSize(viewports.phone);
		await openPath(page, `${planPath}/cash-flow`);
		await page.getByLabel(/Cash on hand at the start/).fill('25000');
		await page.getByLabel('Minimum balance to keep ($)').fill('5000');
		await page.getByLabel('Corn', { exact: true }).selectOption('12');
		await page.getByRole('button', { name: 'Save the settings' }).click();
		// Saved once the page reloads its data: the settings it states are the new ones.
		await expect
			.poll(() => text(page, '[data-testid="cash-settings"]'))
			.toContain('From $25,000 cash');

		const flow = (await owner.fetch(`${apiPath}/cash-flow`).then((r) => r.json())).cashFlow;
		expect(flow.startingCashUsd).toBe(25_000);
		await expect
			.poll(() => text(page, '[data-testid="peak-loan"]'))
			.toBe(formatUsd(flow.peakLoanUsd));
		expect(await text(page, '[data-testid="peak-loan-month"]')).toContain(
			`${MONTH_NAMES[flow.peakLoan.month - 1]} ${flow.peakLoan.year}`
		);
		// Corn sold in December: the December cell of crop sales is the first year's corn revenue.
		const sales = flow.years[0].lines.find((l: { key: string }) => l.key === 'crop-sales');
		const cells = await page.locator('tr[data-row="line-crop-sales"] td').allTextContents();
		expect(cells[11].trim()).toBe(formatNumber(sales.byMonthUsd[11]));
		expect(await text(page, '[data-testid="credit-caution"]')).toMatch(/lender/);
		await lookAt(page, 'cash-flow');
	});
});
