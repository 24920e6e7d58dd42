// Review in Chromium on a farm of the test's own (the seeded demo stays as it was; its lender is not
// used, since a membership of the demo lender's would change the demo's rows): the owner shares a plan,
// the lender finds it first on their home, comments and asks for changes; the owner sees the new state
// and the e-mail, edits and shares again; the lender approves, then prints the report to PDF, whose text
// is read back with pdftotext (poppler-utils). Screenshots of the reviewer's home, the review panel and
// the report at phone and desktop width.
import { execFile } from 'node:child_process';
import { promisify } from 'node:util';
import { and, arrayContains, eq } from 'drizzle-orm';
import type { BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { capturedMail, memberships, users } from '../../src/lib/server/db/schema';
import {
	checkBothWidths,
	freshPage,
	openPath,
	sharedBrowser,
	useSession
} from '../support/browser';
import { testDb } from '../support/db';
import { addMember, farmFromScenario } from '../support/farms';
import { registerUser, type Client } from '../support/http';
import { baseUrl } from '../support/server';

const run = promisify(execFile);
const db = testDb();
let context: BrowserContext;
let release: () => Promise<void>;
let owner: Client;
let lender: Client;
let ownerEmail: string;
let farmId: string;
let planPath: string;

const session = (client: Client) =>
	useSession(
		context,
		client.cookieList().map((cookie) => ({ ...cookie, url: baseUrl }))
	);
/** Opens a plan page and waits for its live results: the page's scripts are running by then. */
async function openPlan(page: Page, path: string) {
	await openPath(page, path);
	await page.locator('tr[data-row="netReturn"] td').first().waitFor();
}
const reviewState = (page: Page) =>
	page.getByTestId('review-state').locator('[data-review-state]').getAttribute('data-review-state');

/**
 * Looks at a screen at phone and desktop width: nothing wider than the window, big touch targets. A
 * radio button inside a 44 px label row (the decision) is reached through its label, named in `besides`.
 */
async function lookAt(
	page: Page,
	name: string,
	{ targets = true, besides = [] as string[], section = '' } = {}
) {
	await checkBothWidths(page, name, {
		targets,
		besides,
		// The part looked at, on its own: a long page's full screenshot is too small to read.
		atEach: async (size) => {
			if (section && process.env.SCREENSHOTS) {
				await page.locator(section).screenshot({ path: `screenshots/${name}-${size}-part.png` });
			}
		}
	});
}

beforeAll(async () => {
	({ context, release } = await sharedBrowser());
	({ owner, farmId } = await farmFromScenario(db, 'scenarios/reference.json', 'review-e2e'));
	const plans = (await (await owner.fetch(`/api/v1/farms/${farmId}/plans`)).json()) as {
		plans: { id: string }[];
	};
	const copy = await owner.json(`/api/v1/farms/${farmId}/plans/${plans.plans[0].id}/copy`, 'POST', {
		name: 'Cover crops grazed'
	});
	const planId = ((await copy.json()) as { plan: { id: string } }).plan.id;
	planPath = `/farms/${farmId}/plans/${planId}`;
	const account = await registerUser('review-e2e-lender');
	lender = account.client;
	await addMember(db, farmId, account.email, 'reviewer');
	const [row] = await db
		.select({ email: users.email })
		.from(memberships)
		.innerJoin(users, eq(users.id, memberships.userId))
		.where(and(eq(memberships.farmId, farmId), eq(memberships.role, 'owner')));
	ownerEmail = row.email;
});
afterAll(() => release());

describe('a plan reviewed by the lender', () => {
	it('is shared, sent back with changes, edited, shared again, approved and printed', async () => {
		const page = await freshPage(context);

		// The owner shares version 1.
		await session(owner);
		await openPlan(page, planPath);
		await page.getByLabel('Message to the reviewers (optional)').fill('Covers grazed in the fall.');
		await page.getByRole('button', { name: 'Share version 1 for review' }).click();
		await page.getByRole('status').filter({ hasText: 'Shared for review' }).waitFor();
		expect(await reviewState(page)).toBe('awaiting_review');

		// The lender finds it first on their home, and asks for changes.
		await session(lender);
		await openPath(page, '/farms');
		const first = page.getByTestId('reviewer-plans').locator('tr[data-plan-row]').first();
		expect(await first.getAttribute('data-state')).toBe('awaiting_review');
		expect(await first.textContent()).toContain('Cover crops grazed');
		// The new-farm form below the lists has its own (smaller) unit-system radios.
		await lookAt(page, 'reviewer-home', { besides: ['unitSystem'] });
		await first.getByRole('link', { name: 'Cover crops grazed' }).click();
		await page.waitForURL(/\/plans\/[0-9a-f-]{36}\?version=1/);
		await page.locator('tr[data-row="netReturn"] td').first().waitFor();
		await page
			.getByLabel('Your comment on version 1')
			.fill('Show the hay bill if the covers fail.');
		await page.getByLabel('Request changes').check();
		await page.getByRole('button', { name: 'Send' }).click();
		await page.getByText('Decision recorded').waitFor();
		expect(await reviewState(page)).toBe('changes_requested');
		// Sent: the form is empty again, ready for the next comment.
		expect(await page.getByLabel('Your comment on version 1').inputValue()).toBe('');
		await page.locator('#review').scrollIntoViewIfNeeded();
		await lookAt(page, 'review-panel-reviewer', { besides: ['decision'], section: '#review' });

		// The owner sees the state and the e-mail, edits, saves and shares version 2.
		await session(owner);
		await openPlan(page, planPath);
		expect(await reviewState(page)).toBe('changes_requested');
		expect(await page.getByTestId('review-history').textContent()).toContain(
			'Show the hay bill if the covers fail.'
		);
		const [mail] = await db
			.select()
			.from(capturedMail)
			.where(arrayContains(capturedMail.envelopeTo, [ownerEmail]));
		expect(mail.subject).toContain('Changes requested');
		expect(mail.text).toContain(`${baseUrl}${planPath}?version=1`);
		// Big Bend starts its rotation a year later: a new version with new figures.
		const phase = page.getByLabel(/^Rotation year of Big Bend in/);
		const phases = await phase
			.locator('option')
			.evaluateAll((options) => options.map((o) => (o as HTMLOptionElement).value));
		const current = await phase.inputValue();
		await phase.selectOption(phases.find((v) => v !== current)!);
		await page.getByLabel('Note on this version').fill('Hay bill shown for a failed cover');
		await page.getByRole('button', { name: 'Save as a new version' }).click();
		await page.getByText('Saved as version 2.').waitFor();
		await page.getByRole('button', { name: 'Share version 2 for review' }).click();
		await page.getByRole('status').filter({ hasText: 'Shared for review' }).waitFor();
		expect(await reviewState(page)).toBe('awaiting_review');
		await lookAt(page, 'review-panel-owner', { section: '#review' });

		// The lender approves version 2; version 1 keeps its changes requested.
		await session(lender);
		await openPlan(page, planPath);
		await page.getByLabel('Your comment on version 2').fill('Thank you: approved.');
		await page.getByLabel('Approve this version').check();
		await page.getByRole('button', { name: 'Send' }).click();
		await page.getByText('Decision recorded').waitFor();
		expect(await reviewState(page)).toBe('approved');
		expect(
			await page
				.locator('[data-review-version="1"] [data-review-state]')
				.getAttribute('data-review-state')
		).toBe('changes_requested');

		// The report of version 2, on screen and printed.
		await openPath(page, `${planPath}/report?version=2`);
		await page.getByTestId('plan-report').waitFor();
		await lookAt(page, 'plan-report', { targets: false });
		// The budget's lines are open, to print.
		expect(
			await page.getByTestId('partial-budget').locator('details').getAttribute('open')
		).not.toBeNull();
		{
			// Kept beside the screenshots (ignored by git) for a person to look at.
			const pdf = 'screenshots/plan-report.pdf';
			await page.pdf({ path: pdf, format: 'Letter', printBackground: true });
			const { stdout: text } = await run('pdftotext', ['-layout', pdf, '-']);
			const { stdout: info } = await run('pdfinfo', [pdf]);
			for (const expected of [
				'Cover crops grazed, version 2',
				'Maple Coulee Farm, Upper Midwest',
				'Approved',
				'Fields and years',
				'Big Bend',
				'Whole-farm results by year',
				'Partial budget against the reference plan',
				'Net return',
				'The herd is fed hay for the whole 180-day feeding season.',
				'ASABE EP496/D497',
				'Thank you: approved.',
				'Nitrogen rates must follow local regulations',
				'Credit decisions rest with the lender'
			]) {
				expect(text.replace(/\s+/g, ' '), expected).toContain(expected);
			}
			// The site's header and the screen's buttons are not printed.
			expect(text).not.toContain('Sign out');
			expect(text).not.toContain('Print or save as PDF');
			expect(Number(/Pages:\s+(\d+)/.exec(info)?.[1])).toBeGreaterThan(1);
		}
	});
});
