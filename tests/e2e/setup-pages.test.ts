// Every farm set-up page of the demo farm at phone and desktop width, as its owner and as its lender:
// nothing wider than the window, a screenshot to look at, and for the lender no edit controls and a
// 403 when posting anyway. The demo farm is only read.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { BrowserContext } from 'playwright-core';
import { testDb } from '../support/db';
import {
	checkBothWidths,
	freshPage,
	openPath,
	sessionCookies,
	sharedBrowser,
	useSession
} from '../support/browser';
import { demoFarmId } from '../support/farms';
import { demoUsers } from '../support/server';

const pages = [
	'fields',
	'crops',
	'herd',
	'people',
	'prices',
	'operations',
	'practices',
	'rotations'
];

let context: BrowserContext;
let release: () => Promise<void>;
let farmPath: string;
let owner: Awaited<ReturnType<typeof sessionCookies>>;
let lender: Awaited<ReturnType<typeof sessionCookies>>;

beforeAll(async () => {
	let farmId: string;
	[{ context, release }, owner, lender, farmId] = await Promise.all([
		sharedBrowser(),
		sessionCookies(demoUsers.owner),
		sessionCookies(demoUsers.lender),
		demoFarmId(testDb(), 'Maple Coulee Farm')
	]);
	farmPath = `/farms/${farmId}`;
});
afterAll(() => release());

// Each page loaded once and looked at in both widths by resizing it.
describe('every set-up page at phone and desktop width', () => {
	it('the owner’s set-up pages fit the window', async () => {
		await useSession(context, owner);
		const page = await freshPage(context);
		for (const name of pages) {
			const response = await openPath(page, `${farmPath}/${name}`);
			expect(response?.status(), name).toBe(200);
			await checkBothWidths(page, `setup-${name}-owner`);
		}
	});

	it('the lender reads every set-up page with no edit controls', async () => {
		await useSession(context, lender);
		const page = await freshPage(context);
		for (const name of pages) {
			const response = await openPath(page, `${farmPath}/${name}`);
			expect(response?.status(), name).toBe(200);
			await expect(page.locator('main form').count(), `${name} has a form`).resolves.toBe(0);
			await expect(page.locator('main button').count(), `${name} has a button`).resolves.toBe(0);
			await checkBothWidths(page, `setup-${name}-lender`);
		}
	});
});

describe('the lender posting anyway', () => {
	it('is refused with 403 and nothing changes', async () => {
		await useSession(context, lender);
		const page = await freshPage(context);
		await openPath(page, `${farmPath}/fields`);
		const before = await page.locator('tbody tr').count();
		const answer = await page.request.post(`${farmPath}/fields?/create`, {
			form: { name: 'Lender field', area: '5', productivityIndex: '1' },
			headers: { Origin: new URL(page.url()).origin, Accept: 'text/html' }
		});
		expect(answer.status()).toBe(403);
		await page.reload();
		await expect(page.locator('tbody tr').count()).resolves.toBe(before);
	});
});
