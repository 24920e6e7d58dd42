import { rmSync } from 'node:fs';
import { mkdir, mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import AxeBuilder from '@axe-core/playwright';
import { chromium, type BrowserContext, type Page } from 'playwright-core';
import { expect } from 'vitest';
import { signedIn } from './http';
import { baseUrl, DEMO_PASSWORD } from './server';

export const viewports = {
	phone: { width: 390, height: 844 },
	desktop: { width: 1280, height: 800 }
} as const;

/**
 * Debian's Chromium headless shell (package chromium-headless-shell): the same Blink engine without the
 * full browser's windowing and GPU layers (the end-to-end files ran 141 s with the full browser, 106 s
 * with it). A fresh profile; flags keep it off the (closed) network. A profile keeps compiled scripts
 * between pages, which a new incognito-like context does not, so tests change who is signed in with
 * `useSession` rather than opening another browser or context.
 */
export async function openBrowser(): Promise<{
	context: BrowserContext;
	profile: string;
	close: () => Promise<void>;
}> {
	const profile = await mkdtemp(join(tmpdir(), 'furrowcast-chromium-'));
	const context = await chromium.launchPersistentContext(profile, {
		executablePath: '/usr/bin/chromium-headless-shell',
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
		profile,
		close: async () => {
			await context.close();
			await rm(profile, { recursive: true, force: true });
		}
	};
}

let workerBrowser: ReturnType<typeof openBrowser> | undefined;

/**
 * The test worker's one browser, opened by the first end-to-end file that asks and shared by the files
 * the worker runs after it: a launch cost 2.4 CPU-s when measured here, and later files' pages reuse the compiled
 * scripts in its profile. Playwright kills the browsers it launched when the worker exits; the profile
 * goes with them. `release` leaves the browser as the next file expects it: no pages, signed out.
 */
export async function sharedBrowser(): Promise<{
	context: BrowserContext;
	release: () => Promise<void>;
}> {
	if (!workerBrowser) {
		workerBrowser = openBrowser();
		const { profile } = await workerBrowser;
		process.once('exit', () => rmSync(profile, { recursive: true, force: true }));
	}
	const { context } = await workerBrowser;
	return {
		context,
		release: async () => {
			await Promise.all(context.pages().map((page) => page.close()));
			await context.clearCookies();
		}
	};
}

type SessionCookies = Parameters<BrowserContext['addCookies']>[0];

/**
 * The session cookies of a sign-in over HTTP, the same ones the sign-in page sets: for tests about
 * what a signed-in person sees rather than about signing in.
 */
export async function sessionCookies(email: string): Promise<SessionCookies> {
	const client = await signedIn(email);
	return client.cookieList().map((cookie) => ({ ...cookie, url: baseUrl }));
}

/** Makes the context's pages signed in with these cookies only (none: signed out). */
export async function useSession(context: BrowserContext, cookies: SessionCookies) {
	await context.clearCookies();
	if (cookies.length) await context.addCookies(cookies);
}

export async function signInAs(page: Page, email: string, password = DEMO_PASSWORD) {
	await page.goto('/signin');
	await page.getByLabel('E-mail', { exact: true }).fill(email);
	await page.getByLabel('Password').fill(password);
	await page.getByRole('button', { name: 'Sign in' }).click();
}

/**
 * Saves a screenshot under screenshots/ (ignored by git) for a person to look at, when the run asks for
 * them (`SCREENSHOTS=1 npm test -- --project e2e`): encoding full-page PNGs is a large share of the
 * end-to-end time, and nobody looks at them in CI.
 */
export async function screenshot(page: Page, name: string) {
	if (!process.env.SCREENSHOTS) return;
	await mkdir('screenshots', { recursive: true });
	await page.screenshot({ path: `screenshots/${name}.png`, fullPage: true });
}

/** How far the page is wider than the window, with what sticks out when it is (to find the cause). */
export const overflow = async (page: Page) => {
	const wider = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
	if (wider > 0)
		console.log(
			await page.evaluate(() =>
				[...document.querySelectorAll('body *')]
					.filter((el) => el.getBoundingClientRect().right > window.innerWidth + 1)
					.filter((el) => !el.closest('.overflow-x-auto'))
					.map((el) => `${el.tagName} ${el.className} ${el.textContent?.slice(0, 30)}`)
			)
		);
	return wider;
};

/**
 * WCAG 2.1 A and AA rules as axe-core checks them, each violation as its rule and the elements it found.
 * axe runs in the page itself: the default opens a blank page per check to merge the results of
 * cross-origin frames, which the app has none of, and that doubles each check's time. It keeps every
 * element only for violations (one each for the rules that pass): a third less time on the plan pages.
 */
export async function axeViolations(page: Page) {
	const results = await new AxeBuilder({ page })
		.withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa'])
		.setLegacyMode()
		.options({ resultTypes: ['violations'] })
		.analyze();
	// A check that ran at all passes some rules; none passed would mean axe saw no page.
	expect(results.passes.length).toBeGreaterThan(0);
	return results.violations.map(
		(v) => `${v.id}: ${v.nodes.map((n) => n.target.join(' ')).join(', ')}`
	);
}

/** Buttons and links in the page's main part smaller than a 44 px touch target, by their text. */
export const smallTargets = (page: Page) =>
	page.evaluate(() =>
		[...document.querySelectorAll('main a, main button, main input, main select')]
			.filter((el) => {
				const box = el.getBoundingClientRect();
				if (el instanceof HTMLInputElement && el.type === 'checkbox') return false;
				return box.width > 0 && box.height < 44;
			})
			.map((el) => el.textContent?.trim() || el.getAttribute('name'))
	);
