// Accessibility rules (WCAG 2.1 A and AA, as axe-core checks them) on the main screens.
import AxeBuilder from '@axe-core/playwright';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { BrowserContext, Page } from 'playwright-core';
import { openBrowser, sessionCookies, useSession } from '../support/browser';
import { demoUsers } from '../support/server';

let context: BrowserContext;
let close: () => Promise<void>;
let owner: Awaited<ReturnType<typeof sessionCookies>>;
let farmPath: string;

beforeAll(async () => {
	[{ context, close }, owner] = await Promise.all([openBrowser(), sessionCookies(demoUsers.owner)]);
	await useSession(context, owner);
	const { farms } = await (await context.request.get('/api/v1/farms')).json();
	farmPath = `/farms/${farms.find((f: { name: string }) => f.name === 'Maple Coulee Farm').id}`;
});
afterAll(() => close());

async function violations(page: Page) {
	const results = await new AxeBuilder({ page })
		.withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa'])
		// axe.run in the page itself: the default opens a blank page per check to merge the results of
		// cross-origin frames, which the app has none of, and that doubles each check's time.
		.setLegacyMode()
		.analyze();
	// A check that ran at all passes some rules; none passed would mean axe saw no page.
	expect(results.passes.length).toBeGreaterThan(0);
	return results.violations.map(
		(v) => `${v.id}: ${v.nodes.map((n) => n.target.join(' ')).join(', ')}`
	);
}

const screens: [string, () => string][] = [
	['farm list', () => '/farms'],
	['farm home', () => farmPath],
	['farm data', () => `${farmPath}/data`],
	['farm settings', () => `${farmPath}/settings`],
	['glossary', () => '/glossary']
];

describe('accessibility', () => {
	it.each(screens)('the %s has no WCAG A/AA violations', async (_name, path) => {
		await useSession(context, owner);
		const page = await context.newPage();
		await page.goto(path());
		expect(await violations(page)).toEqual([]);
		await page.close();
	});

	it('the sign-in page has none, signed out', async () => {
		await useSession(context, []);
		const page = await context.newPage();
		await page.goto('/signin');
		expect(await violations(page)).toEqual([]);
		await page.close();
	});
});
