import { mkdir } from 'node:fs/promises';
import { chromium, type Browser, type BrowserContext, type Page } from 'playwright-core';
import { inject } from 'vitest';
import { signedIn } from './http';
import { baseUrl, DEMO_PASSWORD } from './server';

export const viewports = {
	phone: { width: 390, height: 844 },
	desktop: { width: 1280, height: 800 }
} as const;

/** The run's Chromium (browser-setup.ts). `close()` ends this file's contexts, not the browser. */
export function connectBrowser(): Promise<Browser> {
	return chromium.connect(inject('browserEndpoint'));
}

/** A fresh context: nobody signed in, no cookies or storage from any other context. */
export function newContext(browser: Browser): Promise<BrowserContext> {
	return browser.newContext({ baseURL: baseUrl });
}

/**
 * A context already signed in (over HTTP, with the same session cookie the sign-in page sets), for
 * tests about what a signed-in person sees rather than about signing in.
 */
export async function signedInContext(browser: Browser, email: string): Promise<BrowserContext> {
	const [context, client] = await Promise.all([newContext(browser), signedIn(email)]);
	await context.addCookies(client.cookieList().map((cookie) => ({ ...cookie, url: baseUrl })));
	return context;
}

export async function signInAs(page: Page, email: string, password = DEMO_PASSWORD) {
	await page.goto('/signin');
	await page.getByLabel('E-mail').fill(email);
	await page.getByLabel('Password').fill(password);
	await page.getByRole('button', { name: 'Sign in' }).click();
}

/** Saves a screenshot under screenshots/ (ignored by git) for a person to look at. */
export async function screenshot(page: Page, name: string) {
	await mkdir('screenshots', { recursive: true });
	await page.screenshot({ path: `screenshots/${name}.png`, fullPage: true });
}
