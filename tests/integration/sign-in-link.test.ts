// Sign-in by e-mailed link (Auth.js's e-mail provider through the app's mail and the local sink).
import { and, eq } from 'drizzle-orm';
import { describe, expect, it } from 'vitest';
import { auditLog, users } from '../../src/lib/server/db/schema';
import { testDb } from '../support/db';
import { Client, registerUser, uniqueEmail } from '../support/http';
import { linkInMail, mailTo } from '../support/mail';

const db = testDb();

function askForLink(client: Client, email: string, redirectTo = '/farms') {
	return client.postForm('/signin/link', { providerId: 'nodemailer', email, redirectTo });
}

describe('the e-mailed sign-in link', () => {
	it('signs the account in once; the same link then fails', async () => {
		const { email } = await registerUser('link');
		const client = new Client();
		const asked = await askForLink(client, email, '/farms?from=link');
		expect(asked.status).toBe(303);
		expect(asked.headers.get('location')).toBe('/signin/check-email');
		expect(client.hasSession()).toBe(false);

		const [mail] = await mailTo(email);
		expect(mail.subject).toBe('Your sign-in link for Furrowcast');
		const link = await linkInMail(email, '/auth/callback/nodemailer');
		const followed = await client.fetch(link);
		expect(followed.status).toBe(302);
		expect(new URL(followed.headers.get('location')!, 'http://x').pathname).toBe('/farms');
		expect(client.hasSession()).toBe(true);
		const farms = await client.fetch('/api/v1/farms');
		expect(farms.status).toBe(200);

		const again = new Client();
		const reused = await again.fetch(link);
		expect(reused.headers.get('location')).toContain('error=Verification');
		expect(again.hasSession()).toBe(false);
		const page = await again.fetch(
			reused.headers.get('location')!.replace(/^https?:\/\/[^/]+/, ''),
			{
				headers: { Accept: 'text/html' }
			}
		);
		expect(await page.text()).toContain('That sign-in link has expired or was already used.');
	});

	it('gives a new address an account on its first sign-in, logged as registered', async () => {
		const email = uniqueEmail('link-new');
		const client = new Client();
		await askForLink(client, email);
		expect(await db.$count(users, eq(users.email, email))).toBe(0);
		await client.fetch(await linkInMail(email, '/auth/callback/nodemailer'));
		expect(client.hasSession()).toBe(true);
		const user = await db.query.users.findFirst({ where: eq(users.email, email) });
		expect(user?.passwordHash).toBeNull();
		expect(user?.emailVerified).toBeInstanceOf(Date);
		expect(
			await db.$count(
				auditLog,
				and(eq(auditLog.userId, user!.id), eq(auditLog.action, 'user.registered'))
			)
		).toBe(1);
	});

	it('refuses a malformed address and sends nothing', async () => {
		const response = await askForLink(new Client(), 'not-an-address');
		expect(response.status).toBe(400);
		expect(await response.text()).toContain('Enter a valid e-mail address');
	});

	it('sends at most five links an hour to one address', async () => {
		const email = uniqueEmail('link-limit');
		for (let i = 0; i < 5; i++) expect((await askForLink(new Client(), email)).status).toBe(303);
		const sixth = await askForLink(new Client(), email);
		expect(sixth.status).toBe(429);
		expect(await sixth.text()).toContain('Five sign-in links were sent');
		expect(await mailTo(email)).toHaveLength(5);
	});
});
