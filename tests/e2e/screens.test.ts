// Every screen at phone and desktop width: nothing wider than the window, and a screenshot to look at.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { BrowserContext } from 'playwright-core';
import {
	checkBothWidths,
	freshPage,
	openPath,
	sessionCookies,
	sharedBrowser,
	useSession,
	viewports
} from '../support/browser';
import { demoUsers } from '../support/server';

let context: BrowserContext;
let release: () => Promise<void>;
// Who is signed in: a new account of the test's own, and the site admin for the accounts page.
let newcomer: Awaited<ReturnType<BrowserContext['cookies']>>;
let admin: Awaited<ReturnType<typeof sessionCookies>>;

/** Registers through the form like a first-time visitor; the context is then signed in as them. */
async function registerThroughForm() {
	const page = await freshPage(context);
	await openPath(page, '/register');
	await page.getByLabel('Your name').fill('Screens Tester');
	await page.getByLabel('E-mail').fill(`screens-${crypto.randomUUID().slice(0, 8)}@example.test`);
	await page.getByLabel('Password', { exact: true }).fill('screens-password');
	await page.getByLabel('Password again').fill('screens-password');
	await page.getByRole('button', { name: 'Create account' }).click();
	await page.waitForURL('**/farms');
}

beforeAll(async () => {
	[{ context, release }, admin] = await Promise.all([
		sharedBrowser(),
		sessionCookies(demoUsers.admin)
	]);
	await registerThroughForm();
	newcomer = await context.cookies();
});
afterAll(() => release());

// Each screen loaded once and looked at in both widths by resizing it.
describe('every screen at phone and desktop width', () => {
	it('the farm list, a new farm form and the settings fit the window', async () => {
		await useSession(context, newcomer);
		const page = await freshPage(context);
		await page.setViewportSize(viewports.phone);
		await openPath(page, '/farms');
		// The form starts open for someone with no farms yet, folded away otherwise.
		const formOpen = await page.locator('details').evaluate((d) => (d as HTMLDetailsElement).open);
		if (!formOpen) await page.getByText('New farm…').click();
		await page.getByRole('button', { name: 'Create farm' }).click();
		await page.waitForSelector('[data-error-for="name"]');
		await checkBothWidths(page, 'new-farm-errors');

		await page.getByLabel('Farm name').fill('Screens farm');
		await page.getByRole('button', { name: 'Create farm' }).click();
		await page.waitForURL(/\/farms\/[0-9a-f-]{36}$/);
		await openPath(page, `${new URL(page.url()).pathname}/settings`);
		await expect(page.getByLabel('Farm name').inputValue()).resolves.toBe('Screens farm');
		await checkBothWidths(page, 'farm-settings');
	});

	it('the accounts page fits the window (site admin)', async () => {
		await useSession(context, admin);
		const page = await freshPage(context);
		await openPath(page, '/admin');
		await expect(page.getByRole('cell', { name: demoUsers.lender }).isVisible()).resolves.toBe(
			true
		);
		await checkBothWidths(page, 'admin');
	});

	it.each(['/glossary', '/'])('%s fits the window', async (path) => {
		await useSession(context, newcomer);
		const page = await freshPage(context);
		const response = await openPath(page, path);
		expect(response?.status()).toBe(200);
		await checkBothWidths(page, path.slice(1) || 'home');
	});
});
