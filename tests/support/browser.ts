import { readFileSync, rmSync } from 'node:fs';
import { mkdir, mkdtemp, rm } from 'node:fs/promises';
import { createRequire } from 'node:module';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { chromium, type BrowserContext, type Page } from 'playwright-core';
import { expect } from 'vitest';
import { signedIn } from './http';
import { baseUrl, DEMO_PASSWORD } from './server';

export const viewports = {
	phone: { width: 390, height: 844 },
	desktop: { width: 1280, height: 800 }
} as const;

/** The window a page opens with (Playwright's default), and a reused page is set back to. */
const openingWindow = { width: 1280, height: 720 };

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
		viewport: openingWindow,
		args: [
			'--no-sandbox',
			'--disable-gpu',
			'--disable-quic',
			'--no-first-run',
			'--disable-background-networking',
			'--disable-component-update',
			'--disable-sync',
			// One renderer process for all pages, kept from page to page with the app's compiled
			// scripts in it, instead of a new process per page: the e2e files took 119–130 CPU-s
			// instead of 147–155 (61–66 s instead of 75–79 s) when measured here.
			'--renderer-process-limit=1'
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
 * goes with them. `release` leaves the browser as the next file expects it: signed out, with no page
 * but the blank one it opened with. That page keeps the one renderer process alive: with no page open,
 * Chromium ends it, and the next page starts another (over 40 renderers in a run of the e2e files, not
 * 2, and 9 CPU-s more, 133 against 124, when measured here).
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
			const [, ...opened] = context.pages();
			await Promise.all(opened.map((page) => page.close()));
			await freshPage(context);
			await context.clearCookies();
		}
	};
}

const answersDialogs = new WeakSet<Page>();

/**
 * The worker's one page, made ready for the next test: blank, at the window it opened with. Tests take
 * this page rather than opening and closing one each: 20 pages opened and closed cost 9.6–10.3 CPU-s
 * here, the same 20 loads in one page 4.6–5.2. A test that listens to the page's events stops
 * listening before it ends.
 */
export async function freshPage(context: BrowserContext): Promise<Page> {
	// A test that closed it anyway leaves the next one a new page.
	const page = context.pages()[0] ?? (await context.newPage());
	if (!answersDialogs.has(page)) {
		answersDialogs.add(page);
		// A plan left with unsaved edits asks before it is left, where a closed page never asked;
		// any other dialog is dismissed, as Playwright does when nothing listens.
		page.on('dialog', (dialog) =>
			dialog.type() === 'beforeunload' ? dialog.accept() : dialog.dismiss()
		);
	}
	await page.goto('about:blank');
	const window = page.viewportSize();
	if (window?.width !== openingWindow.width || window.height !== openingWindow.height)
		await page.setViewportSize(openingWindow);
	return page;
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

/**
 * Makes the context's pages signed in with these cookies only (none: signed out). Open pages go to a
 * blank page first: every answer of the app renews the session cookie, so a request still on its way
 * from the last user's page would otherwise sign the context back in as them.
 */
export async function useSession(context: BrowserContext, cookies: SessionCookies) {
	await Promise.all(context.pages().map((page) => page.goto('about:blank')));
	await context.clearCookies();
	if (cookies.length) await context.addCookies(cookies);
}

/**
 * Opens `path` and waits until the page's scripts have taken it over (the root layout marks the page):
 * a select changed or a box ticked before then would be lost, or would post the form without them.
 */
export async function openPath(page: Page, path: string) {
	const response = await page.goto(path);
	await page.locator('html[data-hydrated]').waitFor({ state: 'attached' });
	return response;
}

export async function signInAs(page: Page, email: string, password = DEMO_PASSWORD) {
	await openPath(page, '/signin');
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
 * Looks at the loaded page at phone and then desktop width, resizing it rather than loading it again
 * (the layout answers to the window's width alone): nothing wider than the window; with `targets`, no
 * control in the page's main part under 44 px, but for those named in `besides`; a screenshot
 * `name-phone` and `name-desktop`. `atEach` adds checks of its own at each width. The page is left at
 * desktop width.
 */
export async function checkBothWidths(
	page: Page,
	name: string,
	{
		targets = false,
		besides = [] as string[],
		atEach
	}: { targets?: boolean; besides?: string[]; atEach?: (size: string) => Promise<void> } = {}
) {
	for (const [size, viewport] of Object.entries(viewports)) {
		await page.setViewportSize(viewport);
		// Two frames: what redraws on resize (charts, sticky columns) has done so before measuring.
		await page.evaluate(
			() => new Promise((done) => requestAnimationFrame(() => requestAnimationFrame(done)))
		);
		expect(await overflow(page), `${name} is wider than the ${size} window`).toBeLessThanOrEqual(0);
		if (targets) {
			const small = (await smallTargets(page)).filter((t) => !besides.includes(t ?? ''));
			expect(small, `${name} at ${size} width`).toEqual([]);
		}
		await atEach?.(size);
		await screenshot(page, `${name}-${size}`);
	}
}

/** axe-core's browser build, read once per test worker. */
const axeSource = readFileSync(
	createRequire(import.meta.url).resolve('axe-core/axe.min.js'),
	'utf8'
);

/**
 * WCAG 2.1 A and AA rules as axe-core checks them, each violation as its rule and the elements it found.
 * axe-core itself rather than its Playwright wrapper, which puts axe's 650 kB into the page twice per
 * check (0.4 s each here, against 0.05–0.3 s for the check itself). Elements are kept only for
 * violations, one each for the rules that pass: a third less time on the plan pages.
 */
export async function axeViolations(page: Page) {
	if (!(await page.evaluate(() => 'axe' in window))) await page.evaluate(axeSource);
	const { passed, violations } = await page.evaluate(async () => {
		const { axe } = window as unknown as { axe: typeof import('axe-core') };
		const results = await axe.run(document, {
			runOnly: { type: 'tag', values: ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa'] },
			resultTypes: ['violations']
		});
		return {
			passed: results.passes.length,
			violations: results.violations.map(
				(v) => `${v.id}: ${v.nodes.map((n) => n.target.join(' ')).join(', ')}`
			)
		};
	});
	// A check that ran at all passes some rules; none passed would mean axe saw no page.
	expect(passed).toBeGreaterThan(0);
	return violations;
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
