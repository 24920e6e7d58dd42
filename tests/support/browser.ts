import { mkdtempSync, mkdirSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { chromium, type BrowserContext, type Page } from 'playwright-core';
import { baseUrl, DEMO_PASSWORD } from './server';

export const viewports = {
	phone: { width: 390, height: 844 },
	desktop: { width: 1280, height: 800 }
} as const;

/** Debian's Chromium with a fresh profile; flags keep it off the (closed) network. */
export async function openBrowser(): Promise<{
	context: BrowserContext;
	close: () => Promise<void>;
}> {
	const profile = mkdtempSync(join(tmpdir(), 'furrowcast-chromium-'));
	const context = await chromium.launchPersistentContext(profile, {
		executablePath: '/usr/bin/chromium',
		headless: true,
		baseURL: baseUrl,
		args: [
			'--no-sandbox',
			'--disable-gpu',
			'--disable-quic',
			'--no-first-run',
			'--disable-background-networking',
			'--disable-component-update',
			'--disable-sync'
		]
	});
	return {
		context,
		close: async () => {
			await context.close();
			rmSync(profile, { recursive: true, force: true });
		}
	};
}

export async function signInAs(page: Page, email: string, password = DEMO_PASSWORD) {
	await page.goto('/signin');
	await page.getByLabel('E-mail').fill(email);
	await page.getByLabel('Password').fill(password);
	await page.getByRole('button', { name: 'Sign in' }).click();
}

/** Saves a screenshot under screenshots/ (ignored by git) for a person to look at. */
export async function screenshot(page: Page, name: string) {
	mkdirSync('screenshots', { recursive: true });
	await page.screenshot({ path: `screenshots/${name}.png`, fullPage: true });
}
