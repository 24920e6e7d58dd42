import { verify } from '@node-rs/argon2';
import { eq } from 'drizzle-orm';
import { describe, expect, it } from 'vitest';
import { users } from '../../src/lib/server/db/schema';
import { testDb } from '../support/db';
import { Client, registerUser, signedIn, uniqueEmail } from '../support/http';
import { DEMO_PASSWORD, demoUsers } from '../support/server';

const db = testDb();

describe('sign-in', () => {
	it.each([
		['owner', demoUsers.owner, [['Maple Coulee Farm', 'owner']]],
		['family partner', demoUsers.partner, [['Maple Coulee Farm', 'editor']]],
		[
			'lender',
			demoUsers.lender,
			[
				['Birch Hollow Farm', 'reviewer'],
				['Maple Coulee Farm', 'reviewer']
			]
		],
		['site admin', demoUsers.admin, []]
	])('the demo %s signs in and sees only their farms', async (_who, email, expected) => {
		const client = await signedIn(email);
		const response = await client.fetch('/api/v1/farms');
		expect(response.status).toBe(200);
		const { farms } = await response.json();
		expect(farms.map((f: { name: string; role: string }) => [f.name, f.role])).toEqual(expected);
	});

	it('refuses a wrong password without a session', async () => {
		// An account of the test's own: failed attempts are counted per account and address.
		const { email } = await registerUser('wrong-password');
		const client = new Client();
		const response = await client.signIn(email, 'not-the-password');
		expect(response.status).toBe(400);
		expect(await response.text()).toContain('do not match an account');
		expect(client.hasSession()).toBe(false);
		expect((await client.fetch('/api/v1/farms')).status).toBe(401);
	});

	it('slows down repeated failures: after five, even the right password waits', async () => {
		const email = uniqueEmail('throttle');
		const registration = await new Client().postForm('/register', {
			providerId: 'credentials',
			name: 'Throttle Test',
			email,
			password: 'right-password-1',
			confirmPassword: 'right-password-1'
		});
		expect(registration.status).toBe(302);
		const client = new Client();
		for (let i = 0; i < 5; i++) expect((await client.signIn(email, `wrong-${i}`)).status).toBe(400);
		const refused = await client.signIn(email, 'right-password-1');
		expect(refused.status).toBe(429);
		expect(await refused.text()).toContain('Too many failed attempts');
		expect(client.hasSession()).toBe(false);
	});

	it('signs out', async () => {
		const client = await signedIn(demoUsers.owner);
		await client.postForm('/signout', { redirectTo: '/' });
		expect(client.hasSession()).toBe(false);
		expect((await client.fetch('/api/v1/farms')).status).toBe(401);
	});

	it('answers 401 to the API and sends pages to sign-in when nobody is signed in', async () => {
		const client = new Client();
		const api = await client.fetch('/api/v1/farms');
		expect(api.status).toBe(401);
		expect(await api.json()).toEqual({ message: 'Sign in to use this API.' });
		const page = await client.fetch('/farms', { headers: { Accept: 'text/html' } });
		expect(page.status).toBe(303);
		expect(page.headers.get('location')).toBe('/signin?redirectTo=%2Ffarms');
	});
});

describe('registration', () => {
	it('stores the password hashed with argon2id, never in plain text', async () => {
		const email = uniqueEmail('hash');
		const client = new Client();
		const response = await client.postForm('/register', {
			providerId: 'credentials',
			name: 'Hash Check',
			email,
			password: 'correct horse battery',
			confirmPassword: 'correct horse battery'
		});
		expect(response.status).toBe(302);
		expect(client.hasSession()).toBe(true);
		const row = await db.query.users.findFirst({ where: eq(users.email, email) });
		expect(row?.passwordHash).toMatch(/^\$argon2id\$/);
		expect(row?.passwordHash).not.toContain('correct horse battery');
		expect(await verify(row!.passwordHash!, 'correct horse battery')).toBe(true);
	});

	it('refuses a malformed sign-up with a message for each field and creates no user', async () => {
		// Accounts of the refused address only: other files make accounts of their own meanwhile.
		const accountsOfAddress = () => db.$count(users, eq(users.email, 'not-an-address'));
		const response = await new Client().postForm('/register', {
			providerId: 'credentials',
			name: '',
			email: 'not-an-address',
			password: 'short',
			confirmPassword: 'different'
		});
		expect(response.status).toBe(400);
		const html = await response.text();
		expect(html).toContain('Enter your name.');
		expect(html).toContain('Enter a valid e-mail address');
		expect(html).toContain('Use at least 8 characters.');
		expect(html).toContain('The two passwords do not match.');
		expect(await accountsOfAddress()).toBe(0);
	});

	it('refuses an e-mail that already has an account', async () => {
		const response = await new Client().postForm('/register', {
			providerId: 'credentials',
			name: 'Second Owner',
			email: demoUsers.owner.toUpperCase(),
			password: DEMO_PASSWORD,
			confirmPassword: DEMO_PASSWORD
		});
		expect(response.status).toBe(400);
		expect(await response.text()).toContain('An account with this e-mail already exists.');
	});
});
