// One pass through an invitation in Chromium: the owner invites a new address as reviewer on the
// members page, the mail lands in the sink, the invitee follows the link, signs up and joins.
// Refusals and the API are checked in tests/integration/invitations.test.ts.
import type { BrowserContext } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
	checkBothWidths,
	freshPage,
	openPath,
	screenshot,
	sessionCookies,
	sharedBrowser,
	useSession,
	viewports
} from '../support/browser';
import { createFarm } from '../support/farms';
import { registerUser, uniqueEmail } from '../support/http';
import { linkInMail, mailTo } from '../support/mail';
import { baseUrl, demoUsers } from '../support/server';

let context: BrowserContext;
let release: () => Promise<void>;

beforeAll(async () => {
	({ context, release } = await sharedBrowser());
});
afterAll(() => release());

describe('an invitation by e-mail', () => {
	it('the owner invites a reviewer, who signs up from the link and joins the farm', async () => {
		const { client: owner } = await registerUser('e2e-inviter');
		const farmId = await createFarm(owner, {
			name: 'Invitation Creek Farm',
			region: 'Upper Midwest',
			unitSystem: 'us',
			labourHoursAvailableByMonth: Array(12).fill(200),
			interestRatePercent: 6
		});
		const invitee = uniqueEmail('e2e-lender');

		await useSession(
			context,
			owner.cookieList().map((cookie) => ({ ...cookie, url: baseUrl }))
		);
		const page = await freshPage(context);
		await page.setViewportSize(viewports.desktop);
		await openPath(page, `/farms/${farmId}`);
		await page.getByRole('link', { name: 'Members and invitations' }).click();
		await page.waitForURL(`**/farms/${farmId}/members`);
		await page.getByLabel('E-mail address').fill(invitee);
		await page.getByRole('radio', { name: /Reviewer/ }).check();
		await page.getByRole('button', { name: 'Send invitation' }).click();
		await page.getByText(`Invitation sent to ${invitee}.`).waitFor();
		await expect(page.locator(`[data-invitation="${invitee}"]`).textContent()).resolves.toContain(
			'Reviewer'
		);
		await checkBothWidths(page, 'members');

		// The sink caught the invitation; the admin reads it on the captured-mail page.
		const [mail] = await mailTo(invitee);
		expect(mail.subject).toBe('Invitation to Invitation Creek Farm on Furrowcast');
		const link = await linkInMail(invitee, '/invitations/');
		await useSession(context, await sessionCookies(demoUsers.admin));
		await openPath(page, '/admin/mail');
		await page.getByText(mail.subject).first().click();
		await checkBothWidths(page, 'admin-mail');

		// The invitee, signed out, follows the link, creates an account and joins.
		await useSession(context, []);
		await page.setViewportSize(viewports.phone);
		await openPath(page, link);
		await screenshot(page, 'invitation-phone');
		await page.getByRole('link', { name: 'Create an account' }).click();
		await page.waitForURL('**/register?**');
		await expect(page.getByLabel('E-mail').inputValue()).resolves.toBe(invitee);
		await page.getByLabel('Your name').fill('Lena Invitee');
		await page.getByLabel('Password', { exact: true }).fill('invitee-password');
		await page.getByLabel('Password again').fill('invitee-password');
		await page.getByRole('button', { name: 'Create account' }).click();
		await page.waitForURL((url) => url.pathname === link);
		await page.getByRole('button', { name: 'Join Invitation Creek Farm' }).click();
		await page.waitForURL((url) => url.pathname === `/farms/${farmId}`);
		await expect(page.getByTestId('members').textContent()).resolves.toMatch(
			/Lena Invitee\s*· reviewer/
		);
		// A reviewer is no owner: no link to the members page.
		await expect(page.getByRole('link', { name: 'Members and invitations' }).count()).resolves.toBe(
			0
		);
	});
});
