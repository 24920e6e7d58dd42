// The optimiser page in Chromium on a farm of the test's own made from the demo's plan files (the
// seeded demo stays as it was): solve under an N cap and a soybean share, see the N limit bind, save the
// mix as a plan, draw a trade-off curve and pick a point, show a refused option beside its box, and
// let a reviewer solve but not save. Screenshots at phone and desktop width.
import { readFile } from 'node:fs/promises';
import type { BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { OptimiseResult } from '../../src/lib/engine/optimiser/types';
import {
	checkBothWidths,
	freshPage,
	openPath,
	sharedBrowser,
	useSession
} from '../support/browser';
import { testDb } from '../support/db';
import { addMember, farmFromScenario } from '../support/farms';
import { registerUser, type Client } from '../support/http';
import { baseUrl } from '../support/server';

const db = testDb();
let context: BrowserContext;
let release: () => Promise<void>;
let owner: Client;
let reviewer: Client;
let farmId: string;
let optimisePath: string;

const cookiesOf = (client: Client) =>
	client.cookieList().map((cookie) => ({ ...cookie, url: baseUrl }));

beforeAll(async () => {
	({ context, release } = await sharedBrowser());
	({ owner, farmId } = await farmFromScenario(db, 'scenarios/reference.json', 'optimiser-e2e'));
	// The other demo plan files bring their rotations, so the optimiser has a choice to make.
	for (const file of ['scenarios/small-grain-peas.json', 'scenarios/wide-row-interseeded.json']) {
		const response = await owner.json(
			`/api/v1/farms/${farmId}/plans/import`,
			'POST',
			JSON.parse(await readFile(file, 'utf8'))
		);
		if (response.status !== 201) throw new Error(`importing ${file}: ${response.status}`);
	}
	const account = await registerUser('optimiser-reviewer');
	reviewer = account.client;
	await addMember(db, farmId, account.email, 'reviewer');
	const { plans } = await (await owner.fetch(`/api/v1/farms/${farmId}/plans`)).json();
	const reference = plans.find((p: { isReference: boolean }) => p.isReference);
	optimisePath = `/farms/${farmId}/plans/${reference.id}/optimise`;
});
afterAll(() => release());

type Answer = { result: OptimiseResult; current: { years: OptimiseResult['years'] } };

/** Sets the limits (crop limits folded away until opened), solves, and returns what the API said. */
async function solve(page: Page, limits: { nitrogen?: string; soybeanPercent?: string } = {}) {
	if (limits.nitrogen !== undefined) {
		await page.getByLabel('Purchased N, at most (lb N a year)').fill(limits.nitrogen);
	}
	if (limits.soybeanPercent !== undefined) {
		await page.locator('summary', { hasText: 'Crop limits' }).click();
		await page.getByLabel('Soybean: Most of the farm (%)').fill(limits.soybeanPercent);
	}
	const answered = page.waitForResponse(
		(r) => r.url().endsWith('/optimise') && r.request().method() === 'POST'
	);
	await page.getByRole('button', { name: 'Find the best mix' }).click();
	const response = await answered;
	return { status: response.status(), body: await response.json() };
}

describe('an owner', () => {
	it('solves under an N cap, sees the cap bind, and saves the mix as a plan', async () => {
		const page = await freshPage(context);
		await useSession(context, cookiesOf(owner));
		await openPath(page, optimisePath);
		const { status, body } = await solve(page, { nitrogen: '30000', soybeanPercent: '50' });
		expect(status).toBe(200);
		const { result, current } = body as Answer;
		// The plan as it stands buys more N than the cap, so the cap must hold the mix back.
		expect(Math.max(...current.years.map((y) => y.nitrogenPurchasedLb))).toBeGreaterThan(30_000);
		await page.getByTestId('answer').waitFor();
		expect(await page.getByTestId('answer').getAttribute('data-status')).toBe('optimal');
		const binding = page.locator('[data-testid="binding-limits"] li[data-limit^="nitrogen_"]');
		expect(await binding.count()).toBeGreaterThan(0);
		expect(await binding.first().textContent()).toMatch(/purchased N .* is worth \$/);
		// Every year of the mix keeps the cap, as the page prints it.
		const mixN = await page
			.locator('[data-measure="nitrogen"] tr[data-row="mix"] td')
			.allTextContents();
		expect(mixN).toHaveLength(result.years.length);
		for (const figure of mixN)
			expect(Number(figure.replaceAll(',', ''))).toBeLessThanOrEqual(30_000);
		expect(await page.getByTestId('n-caution').count()).toBeGreaterThan(0);

		await page.getByLabel('Name of the new plan').fill('Optimised: N at most 30,000 lb');
		await page.getByRole('button', { name: 'Save as a plan' }).click();
		const link = page.getByRole('link', { name: 'Optimised: N at most 30,000 lb' });
		await link.waitFor();
		const planId = (await link.getAttribute('href'))!.split('/').at(-1)!;
		const saved = await (await owner.fetch(`/api/v1/farms/${farmId}/plans/${planId}`)).json();
		// Each field takes its largest share's rotation, as the save form offers by default.
		expect(saved.plan.plan.fieldRotations).toEqual(
			expect.arrayContaining(
				result.fields.map((f) => ({
					fieldId: f.fieldId,
					rotationId: f.rotations[0].rotationId,
					startingPhase: f.rotations[0].startingPhase
				}))
			)
		);
		expect(saved.plan.plan.fieldRotations).toHaveLength(result.fields.length);
		await link.click();
		await page.waitForURL(new RegExp(`/plans/${planId}$`));
	});

	it('shows a refused option beside its box', async () => {
		const page = await freshPage(context);
		await useSession(context, cookiesOf(owner));
		await openPath(page, optimisePath);
		const { status } = await solve(page, { nitrogen: '-5' });
		expect(status).toBe(422);
		const issue = page.locator('[data-issue-for="limits.nitrogenPurchasedLbPerYear"]');
		await issue.waitFor();
		expect(await issue.textContent()).toMatch(/N/);
		expect(
			await page.getByLabel('Purchased N, at most (lb N a year)').getAttribute('aria-invalid')
		).toBe('true');
	});

	it('draws an N trade-off curve as a queued job, kept over a reload, and shows a point’s mix', async () => {
		const page = await freshPage(context);
		await useSession(context, cookiesOf(owner));
		await openPath(page, optimisePath);
		await page.getByLabel('Limit to sweep').selectOption('nitrogen');
		await page.getByLabel('From (lb N a year)').fill('10000');
		await page.getByLabel('To (lb N a year)').fill('45000');
		await page.getByLabel('Points', { exact: true }).fill('20');
		await page.getByRole('button', { name: 'Draw the trade-off' }).click();
		await page.getByText('20 points drawn.').waitFor({ timeout: 60_000 });
		// The job's id stays in the address: a reload reads the finished curve back, form and all.
		expect(new URL(page.url()).searchParams.get('curve')).toMatch(/^[0-9a-f-]{36}$/);
		await page.reload();
		await page.getByText('20 points drawn.').waitFor({ timeout: 60_000 });
		expect(await page.getByLabel('To (lb N a year)').inputValue()).toBe('45000');
		await page.getByTestId('trade-off').locator('svg').first().waitFor();
		await page.locator('summary', { hasText: 'The points, to pick one' }).click();
		const rows = page.locator('tr[data-point]');
		expect(await rows.count()).toBe(20);
		// More N allowed never lowers the best net return (the limit only widens what may be chosen).
		const returns = (await rows.locator('td').allTextContents())
			.filter((text) => text.includes('$'))
			.map((text) => Number(text.replace(/[$,]/g, '').replace('−', '-')));
		expect(returns.length).toBeGreaterThan(1);
		for (let i = 1; i < returns.length; i++) {
			expect(returns[i]).toBeGreaterThanOrEqual(returns[i - 1] - 1);
		}
		await rows.last().getByRole('button').click();
		const chosen = page.locator('section[aria-labelledby="chosen-heading"]');
		await chosen.getByTestId('mix-grid').waitFor();
		expect(await chosen.getByTestId('save-mix').count()).toBe(1);
	});

	it('shows a usable optimiser at phone and desktop width', async () => {
		const page = await freshPage(context);
		await useSession(context, cookiesOf(owner));
		await openPath(page, optimisePath);
		await solve(page, { nitrogen: '30000' });
		await page.getByTestId('mix-grid').waitFor();
		await checkBothWidths(page, 'optimiser', { targets: true });
	});
});

describe('a reviewer (lender)', () => {
	it('solves and reads the answer, but is not offered to save it', async () => {
		const page = await freshPage(context);
		await useSession(context, cookiesOf(reviewer));
		await openPath(page, optimisePath);
		const { status } = await solve(page, { nitrogen: '30000' });
		expect(status).toBe(200);
		await page.getByTestId('binding-limits').waitFor();
		expect(await page.getByTestId('save-mix').count()).toBe(0);
	});
});
