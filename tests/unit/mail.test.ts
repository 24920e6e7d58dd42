// The mail settings, the messages' links and wording, and the invitation tokens: pure code, no I/O.
import { describe, expect, it } from 'vitest';
import {
	hashInvitationToken,
	invitationExpiry,
	invitationPath,
	invitationStatus,
	isInvitationTokenShaped,
	newInvitationToken
} from '../../src/lib/server/invitations';
import { DEFAULT_MAIL_FROM, mailConfigFrom } from '../../src/lib/server/mail/config';
import { invitationMail, signInLinkMail } from '../../src/lib/server/mail/templates';

describe('mail settings from the environment', () => {
	it('defaults to the local sink on 127.0.0.1 without TLS or a login', () => {
		const config = mailConfigFrom({});
		expect(config.transport).toMatchObject({
			host: '127.0.0.1',
			port: 2525,
			secure: false,
			auth: undefined
		});
		expect(config.from).toBe(DEFAULT_MAIL_FROM);
	});

	it('points at a real server when the variables say so', () => {
		const config = mailConfigFrom({
			SMTP_HOST: 'smtp.example.test',
			SMTP_PORT: '465',
			SMTP_SECURE: 'true',
			SMTP_USER: 'furrowcast',
			SMTP_PASSWORD: 'secret',
			MAIL_FROM: 'Farm Office <office@example.test>'
		});
		expect(config.transport).toMatchObject({
			host: 'smtp.example.test',
			port: 465,
			secure: true,
			auth: { user: 'furrowcast', pass: 'secret' }
		});
		expect(config.from).toBe('Farm Office <office@example.test>');
	});

	it('refuses a port that is no port, and a login without its password', () => {
		expect(() => mailConfigFrom({ SMTP_PORT: '70000' })).toThrow(/SMTP_PORT/);
		expect(() => mailConfigFrom({ SMTP_PORT: 'twenty-five' })).toThrow(/SMTP_PORT/);
		expect(() => mailConfigFrom({ SMTP_USER: 'furrowcast' })).toThrow(/SMTP_PASSWORD/);
	});
});

describe('the invitation message', () => {
	const url = 'http://127.0.0.1:3000/invitations/abc?x=1&y=2';
	const expiresAt = new Date('2026-12-10T18:00:00Z');

	it('names the farm, the role and who invited, with the link and its expiry', () => {
		const mail = invitationMail({
			farmName: 'Maple Coulee Farm',
			role: 'reviewer',
			invitedBy: 'Ruth Halvorsen',
			url,
			expiresAt
		});
		expect(mail.subject).toBe('Invitation to Maple Coulee Farm on Furrowcast');
		expect(mail.text).toContain(
			'Ruth Halvorsen invites you to Maple Coulee Farm on Furrowcast as a reviewer.'
		);
		expect(mail.text.split('\n')).toContain(url);
		expect(mail.text).toContain('expires on December 10, 2026 at 6:00 PM UTC');
		expect(mail.html).toContain('href="http://127.0.0.1:3000/invitations/abc?x=1&amp;y=2"');
		expect(
			invitationMail({ farmName: 'F', role: 'editor', invitedBy: 'R', url, expiresAt }).text
		).toContain('as an editor.');
	});

	it('escapes what people typed in the HTML, and keeps it as typed in the text', () => {
		const mail = invitationMail({
			farmName: '<b>Bold</b> & "Co"',
			role: 'editor',
			invitedBy: 'R',
			url,
			expiresAt
		});
		expect(mail.html).toContain('&lt;b&gt;Bold&lt;/b&gt; &amp; &quot;Co&quot;');
		expect(mail.html).not.toContain('<b>Bold</b>');
		expect(mail.text).toContain('<b>Bold</b> & "Co"');
	});

	it('the sign-in link message carries the link and says it works once', () => {
		const link = 'http://127.0.0.1:3000/auth/callback/nodemailer?token=t&email=a%40b.test';
		const mail = signInLinkMail({ url: link, host: '127.0.0.1:3000' });
		expect(mail.text.split('\n')).toContain(link);
		expect(mail.text).toContain('works once');
	});
});

describe('invitation tokens', () => {
	it('are stored as SHA-256', () => {
		// FIPS 180-2, appendix B.1: SHA-256("abc").
		expect(hashInvitationToken('abc')).toBe(
			'ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad'
		);
	});

	it('are 256 random bits in 43 base64url characters, each new, hashed as stored', () => {
		const a = newInvitationToken();
		const b = newInvitationToken();
		expect(a.token).toMatch(/^[A-Za-z0-9_-]{43}$/);
		expect(Buffer.from(a.token, 'base64url')).toHaveLength(32);
		expect(a.token).not.toBe(b.token);
		expect(a.tokenHash).toBe(hashInvitationToken(a.token));
		expect(isInvitationTokenShaped(a.token)).toBe(true);
		expect(invitationPath(a.token)).toBe(`/invitations/${a.token}`);
		for (const bad of ['', 'abc', `${a.token}A`, `${a.token.slice(1)}/`, a.tokenHash]) {
			expect(isInvitationTokenShaped(bad)).toBe(false);
		}
	});

	it('expire 7 days after they are sent', () => {
		const sent = new Date('2026-03-01T12:00:00Z');
		expect(invitationExpiry(sent).toISOString()).toBe('2026-03-08T12:00:00.000Z');
	});

	it('are used or withdrawn before they are out of date', () => {
		const now = new Date('2026-03-05T00:00:00Z');
		const past = new Date('2026-03-04T00:00:00Z');
		const future = new Date('2026-03-06T00:00:00Z');
		const row = (acceptedAt: Date | null, revokedAt: Date | null, expiresAt: Date) => ({
			acceptedAt,
			revokedAt,
			expiresAt
		});
		expect(invitationStatus(row(null, null, future), now)).toBe('pending');
		expect(invitationStatus(row(null, null, past), now)).toBe('expired');
		expect(invitationStatus(row(null, null, now), now)).toBe('expired');
		expect(invitationStatus(row(past, null, past), now)).toBe('accepted');
		expect(invitationStatus(row(null, past, future), now)).toBe('revoked');
	});
});
