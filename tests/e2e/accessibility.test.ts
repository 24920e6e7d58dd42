// Accessibility rules (WCAG 2.1 A and AA, as axe-core checks them) on the main screens.
import { afterAll, beforeAll, describe, expect, it, onTestFinished } from 'vitest';
import type { BrowserContext, Page } from 'playwright-core';
import {
	axeViolations,
	freshPage,
	openPath,
	sessionCookies,
	sharedBrowser,
	useSession
} from '../support/browser';
import { demoUsers } from '../support/server';

let context: BrowserContext;
let release: () => Promise<void>;
let owner: Awaited<ReturnType<typeof sessionCookies>>;
let lender: Awaited<ReturnType<typeof sessionCookies>>;
let farmPath: string;
let referencePlanId: string;
let alternativePlanId: string;

beforeAll(async () => {
	[{ context, release }, owner, lender] = await Promise.all([
		sharedBrowser(),
		sessionCookies(demoUsers.owner),
		sessionCookies(demoUsers.lender)
	]);
	await useSession(context, owner);
	const { farms } = await (await context.request.get('/api/v1/farms')).json();
	farmPath = `/farms/${farms.find((f: { name: string }) => f.name === 'Maple Coulee Farm').id}`;
	// The demo's reference plan and the first of its alternatives by name.
	const { plans } = await (await context.request.get(`/api/v1${farmPath}/plans`)).json();
	referencePlanId = plans.find((p: { isReference: boolean }) => p.isReference).id;
	alternativePlanId = plans.find((p: { isReference: boolean }) => !p.isReference).id;
});
afterAll(() => release());

const screens: [string, () => string][] = [
	['farm list', () => '/farms'],
	['farm home', () => farmPath],
	['farm data', () => `${farmPath}/data`],
	['farm settings', () => `${farmPath}/settings`],
	['members page', () => `${farmPath}/members`],
	['glossary', () => '/glossary']
];

// The plans pages, read-only (nothing here saves, so the seeded demo stays as it was), each with what
// must be on the screen before axe looks: the results the editor fetches once the page has loaded.
const planScreens: [string, () => string, { shows: string; atLeast: number }][] = [
	['plans page', () => `${farmPath}/plans`, { shows: '[data-plan]', atLeast: 2 }],
	[
		'reference plan editor',
		() => `${farmPath}/plans/${referencePlanId}`,
		{ shows: 'tr[data-row="netReturn"]', atLeast: 1 }
	],
	[
		'charts of an alternative plan',
		() => `${farmPath}/plans/${alternativePlanId}?tab=charts`,
		{ shows: 'figure', atLeast: 5 }
	],
	[
		'partial budget of an alternative plan',
		() => `${farmPath}/plans/${alternativePlanId}?tab=budget`,
		{ shows: '[data-testid="partial-budget"]', atLeast: 1 }
	],
	[
		'optimiser page',
		() => `${farmPath}/plans/${referencePlanId}/optimise`,
		{ shows: 'form[aria-labelledby="limits-heading"]', atLeast: 1 }
	],
	[
		'compare page',
		() => `${farmPath}/plans/compare?plans=${referencePlanId},${alternativePlanId}`,
		{ shows: '[data-testid="partial-budget"]', atLeast: 1 }
	]
];
const viewers: [string, () => typeof owner][] = [
	['owner', () => owner],
	['lender (reviewer)', () => lender]
];
// The lender's screens are the owner's less the edit controls: checked where those change the page
// most (the editor and the optimiser, which drop their forms); axe is the slowest part of the suite.
const lenderScreens = new Set(['reference plan editor', 'optimiser page']);

/**
 * How many of the page's requests wait for their answer, from now until the test ends (the page is
 * the worker's one page, which the next test takes too).
 */
function requestsWaiting(page: Page) {
	let waiting = 0;
	const sent = () => waiting++;
	const answered = () => waiting--;
	page.on('request', sent).on('requestfinished', answered).on('requestfailed', answered);
	onTestFinished(() => {
		page.off('request', sent).off('requestfinished', answered).off('requestfailed', answered);
	});
	return () => waiting;
}

describe('accessibility', () => {
	it.each(screens)('the %s has no WCAG A/AA violations', async (_name, path) => {
		await useSession(context, owner);
		const page = await freshPage(context);
		await openPath(page, path());
		expect(await axeViolations(page)).toEqual([]);
	});

	it.each(
		planScreens.flatMap(([name, path, screen]) =>
			viewers
				.filter(([who]) => who === 'owner' || lenderScreens.has(name))
				.map(([who, cookies]) => [name, who, path, screen, cookies] as const)
		)
	)(
		'the %s, as the %s, has no WCAG A/AA violations',
		async (_name, _who, path, { shows, atLeast }, cookies) => {
			await useSession(context, cookies());
			const page = await freshPage(context);
			const waiting = requestsWaiting(page);
			await openPath(page, path());
			await expect.poll(() => page.locator(shows).count()).toBeGreaterThanOrEqual(atLeast);
			// The charts set the reference plan beside this one once its results come too: a request
			// the page sent as it opened, so once none waits, the page is as it stays.
			await expect.poll(waiting).toBe(0);
			expect(await axeViolations(page)).toEqual([]);
		}
	);

	it('the sign-in page has none, signed out', async () => {
		await useSession(context, []);
		const page = await freshPage(context);
		await openPath(page, '/signin');
		expect(await axeViolations(page)).toEqual([]);
	});
});
