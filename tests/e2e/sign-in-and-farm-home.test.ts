import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { BrowserContext } from 'playwright-core';
import {
	checkBothWidths,
	freshPage,
	openPath,
	screenshot,
	sessionCookies,
	sharedBrowser,
	signInAs,
	useSession,
	viewports
} from '../support/browser';
import { registerUser } from '../support/http';
import { demoUsers } from '../support/server';

let context: BrowserContext;
let release: () => Promise<void>;

beforeAll(async () => {
	({ context, release } = await sharedBrowser());
});
afterAll(() => release());

// The way in, at phone width; each page also looked at in desktop width by resizing it.
describe('signing in and the farm home', () => {
	it('the owner signs in, opens the farm and sees what is set up', async () => {
		await context.clearCookies();
		const page = await freshPage(context);
		await openPath(page, '/signin');
		await checkBothWidths(page, 'sign-in');
		await page.setViewportSize(viewports.phone);
		await signInAs(page, demoUsers.owner);
		await page.waitForURL('**/farms');
		await expect(
			page.getByTestId('farm-list').getByText('Maple Coulee Farm').isVisible()
		).resolves.toBe(true);
		await page.getByText('Maple Coulee Farm').click();
		await page.waitForURL(/\/farms\/[0-9a-f-]{36}$/);
		await expect(page.getByRole('heading', { level: 1 }).textContent()).resolves.toBe(
			'Maple Coulee Farm'
		);
		await expect(page.getByTestId('setup-summary').textContent()).resolves.toMatch(
			/parts still missing|in place/
		);
		await expect(
			page.getByText('Nitrogen rates must follow local regulations').isVisible()
		).resolves.toBe(true);
		await expect(page.getByTestId('members').textContent()).resolves.toMatch(
			/Dana Whitcombe\s*· reviewer/
		);
		// Nothing may be wider than the window: tables scroll inside their own box.
		await checkBothWidths(page, 'farm-home');

		await page.setViewportSize(viewports.phone);
		await page.getByRole('link', { name: 'Fields', exact: true }).click();
		await page.waitForURL(/\/data#fields$/);
		await expect(page.getByRole('cell', { name: 'North Flat' }).isVisible()).resolves.toBe(true);
		await checkBothWidths(page, 'farm-data');
	});
});

describe('refusals in the browser', () => {
	it('a wrong password shows a message and stays on the sign-in page', async () => {
		// An account of the test's own: failed attempts are counted per account and address.
		const { email } = await registerUser('e2e-wrong-password');
		await context.clearCookies();
		const page = await freshPage(context);
		await signInAs(page, email, 'wrong-password');
		await expect(page.getByRole('alert').textContent()).resolves.toContain(
			'do not match an account'
		);
		expect(new URL(page.url()).pathname).toBe('/signin');
	});

	it('the lender sees the farm but is refused its settings page', async () => {
		await useSession(context, await sessionCookies(demoUsers.lender));
		const page = await freshPage(context);
		await openPath(page, '/farms');
		// Above the farm list, the plans the lender reviews name the farm too.
		await page.getByTestId('farm-list').getByText('Maple Coulee Farm').click();
		await page.waitForURL(/\/farms\/[0-9a-f-]{36}$/);
		await expect(page.getByText('Farm settings').count()).resolves.toBe(0);
		const response = await openPath(page, page.url() + '/settings');
		expect(response?.status()).toBe(403);
		await expect(page.getByRole('heading', { level: 1 }).textContent()).resolves.toContain(
			'may not do this'
		);
	});

	it('a malformed sign-up shows a message beside each field', async () => {
		await context.clearCookies();
		const page = await freshPage(context);
		await page.setViewportSize(viewports.phone);
		await openPath(page, '/register');
		await page.getByLabel('E-mail').fill('nobody-at-all');
		await page.getByLabel('Password', { exact: true }).fill('short');
		await page.getByRole('button', { name: 'Create account' }).click();
		await page.waitForSelector('[data-error-for="email"]');
		await expect(page.locator('[data-error-for="name"]').textContent()).resolves.toBe(
			'Enter your name.'
		);
		await expect(page.locator('[data-error-for="password"]').textContent()).resolves.toBe(
			'Use at least 8 characters.'
		);
		await screenshot(page, 'register-errors-phone');
	});
});
