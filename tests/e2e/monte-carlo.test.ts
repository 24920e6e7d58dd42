// The lender, a reviewer of the demo farm, opens a plan's risk page, starts a Monte Carlo run, sees its
// progress and then its result; the page reopened from its address shows the finished run again (the
// run lives in the job queue, not in the page). Starting a run writes only queue and progress rows,
// which are not the demo's (after-all/ checks). Screenshots at desktop and phone width.
import type { BrowserContext } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
	freshPage,
	openPath,
	overflow,
	screenshot,
	sessionCookies,
	sharedBrowser,
	useSession,
	viewports
} from '../support/browser';
import { testDb } from '../support/db';
import { demoFarmId } from '../support/farms';
import { signedIn } from '../support/http';
import { demoUsers } from '../support/server';

const db = testDb();
let context: BrowserContext;
let release: () => Promise<void>;
let riskPath: string;

beforeAll(async () => {
	({ context, release } = await sharedBrowser());
	const farmId = await demoFarmId(db, 'Maple Coulee Farm');
	const lender = await signedIn(demoUsers.lender);
	const { plans } = await (await lender.fetch(`/api/v1/farms/${farmId}/plans`)).json();
	const plan = plans.find((p: { name: string }) => p.name.startsWith('Wide-row corn'));
	riskPath = `/farms/${farmId}/plans/${plan.id}/risk`;
	await useSession(context, await sessionCookies(demoUsers.lender));
});
afterAll(() => release());

describe('a Monte Carlo run on the risk page', () => {
	it('the lender starts a run, sees its progress, then the result; the address brings it back', async () => {
		const page = await freshPage(context);
		await page.setViewportSize(viewports.desktop);
		await openPath(page, riskPath);
		const form = page.getByRole('form', { name: 'Monte Carlo settings' });
		await expect(
			form.getByRole('spinbutton', { name: 'Corn yield CV, %' }).inputValue()
		).resolves.toBe('15');
		// Enough draws that the run is still going when the page first asks how far it has got.
		await form.getByRole('spinbutton', { name: 'Draws' }).fill('20000');
		await form.getByRole('spinbutton', { name: /^Seed/ }).fill('2027');
		await form.getByRole('button', { name: 'Start the run' }).click();

		const progress = page.getByTestId('monte-carlo-progress');
		await progress.waitFor({ timeout: 10_000 });
		await expect(progress.getByRole('progressbar').count()).resolves.toBe(1);
		await page.waitForURL(/[?&]run=[0-9a-f-]{36}/);

		const result = page.getByTestId('monte-carlo-result');
		await result.waitFor({ timeout: 45_000 });
		const beats = await result.locator('[data-cell="beats-reference"]').textContent();
		expect(beats).toMatch(/^\s*\d{1,3} %\s*$/);
		// A row for each of the plan's five years and the average, each with its percentiles.
		await expect(result.locator('tr[data-row^="spread-"]').count()).resolves.toBe(6);
		await page.getByText('20,000 draws, seed 2027.').waitFor();
		await expect(page.getByTestId('credit-caution').count()).resolves.toBeGreaterThan(0);
		await screenshot(page, 'risk-monte-carlo-1280');

		// Reopened from its address at phone width: the finished run, read back from the queue.
		await page.setViewportSize(viewports.phone);
		await page.reload();
		await result.waitFor({ timeout: 15_000 });
		await expect(result.locator('[data-cell="beats-reference"]').textContent()).resolves.toBe(
			beats
		);
		expect(await overflow(page)).toBeLessThanOrEqual(0);
		await screenshot(page, 'risk-monte-carlo-390');
	});
});
