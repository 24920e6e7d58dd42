// Invitations and members: an owner invites by e-mail, the link's single-use token (stored as its
// SHA-256 only) adds the membership, and every refusal changes nothing in the database.
import { createHash, randomBytes } from 'node:crypto';
import { eq, inArray } from 'drizzle-orm';
import { beforeAll, describe, expect, it } from 'vitest';
import { auditLog, invitations, memberships, users } from '../../src/lib/server/db/schema';
import { testDb } from '../support/db';
import { addMember, createFarm } from '../support/farms';
import { Client, registerUser, uniqueEmail } from '../support/http';
import { linkInMail, mailTo } from '../support/mail';

const db = testDb();
const settings = (name: string) => ({
	name,
	region: 'Upper Midwest',
	unitSystem: 'us',
	labourHoursAvailableByMonth: Array(12).fill(200),
	interestRatePercent: 6
});
const sha256 = (text: string) => createHash('sha256').update(text).digest('hex');

let owner: Client;
let ownerEmail: string;
let editor: Client;
let farmId: string;
// A second farm with an owner of its own, for tokens and ids of another farm.
let otherOwner: Client;
let otherFarmId: string;

beforeAll(async () => {
	const [ownerUser, editorUser, otherUser] = await Promise.all([
		registerUser('inv-owner'),
		registerUser('inv-editor'),
		registerUser('inv-other')
	]);
	({ client: owner, email: ownerEmail } = ownerUser);
	editor = editorUser.client;
	otherOwner = otherUser.client;
	[farmId, otherFarmId] = await Promise.all([
		createFarm(owner, settings('Invitation Test Farm')),
		createFarm(otherOwner, settings('Other Invitation Farm'))
	]);
	await addMember(db, farmId, editorUser.email, 'editor');
});

/** Every row a refusal could touch, for both farms: compared before and after each refusal. */
async function rowsOfBothFarms() {
	const farmIds = [farmId, otherFarmId];
	const [invitationRows, membershipRows, auditRows, userCount] = await Promise.all([
		db
			.select()
			.from(invitations)
			.where(inArray(invitations.farmId, farmIds))
			.orderBy(invitations.id),
		db
			.select()
			.from(memberships)
			.where(inArray(memberships.farmId, farmIds))
			.orderBy(memberships.farmId, memberships.userId),
		db.select().from(auditLog).where(inArray(auditLog.farmId, farmIds)).orderBy(auditLog.id),
		// Accounts of the invited addresses only: other files make accounts of their own meanwhile.
		db.$count(
			users,
			inArray(
				users.email,
				db
					.select({ email: invitations.email })
					.from(invitations)
					.where(inArray(invitations.farmId, farmIds))
			)
		)
	]);
	return { invitationRows, membershipRows, auditRows, userCount };
}

/** Runs `refusal` and checks that it changed nothing. */
async function changesNothing(refusal: () => Promise<void>) {
	const before = await rowsOfBothFarms();
	await refusal();
	expect(await rowsOfBothFarms()).toEqual(before);
}

async function invite(client: Client, farm: string, email: string, role = 'reviewer') {
	return client.json(`/api/v1/farms/${farm}/invitations`, 'POST', { email, role });
}

/** Invites a new address and returns it with the token from the e-mailed link. */
async function invited(role: 'editor' | 'reviewer' = 'reviewer', farm = farmId, by = owner) {
	const email = uniqueEmail('invitee');
	const response = await invite(by, farm, email, role);
	expect(response.status).toBe(201);
	const { invitation } = (await response.json()) as { invitation: { id: string } };
	const path = await linkInMail(email, '/invitations/');
	return { email, id: invitation.id, path, token: path.split('/').pop()! };
}

/** A new account for an address, signed in. */
async function accountFor(email: string) {
	const client = new Client();
	await client.postForm('/register', {
		providerId: 'credentials',
		name: 'Invited Person',
		email,
		password: 'a-long-test-password',
		confirmPassword: 'a-long-test-password'
	});
	expect(client.hasSession()).toBe(true);
	return client;
}

const html = { headers: { Accept: 'text/html' } };

describe('inviting', () => {
	it('saves the invitation with its token hashed, e-mails the link, and logs who invited whom', async () => {
		const email = uniqueEmail('Invitee').toUpperCase();
		const response = await invite(owner, farmId, email, 'editor');
		expect(response.status).toBe(201);
		const { invitation } = await response.json();
		expect(invitation).toMatchObject({
			email: email.toLowerCase(),
			role: 'editor',
			status: 'pending',
			invitedBy: { email: ownerEmail }
		});
		// 7 days from now, to the second (the stated expiry).
		const days = (Date.parse(invitation.expiresAt) - Date.parse(invitation.createdAt)) / 86_400_000;
		expect(days).toBeCloseTo(7, 4);

		const [mail] = await mailTo(email.toLowerCase());
		expect(mail.subject).toBe('Invitation to Invitation Test Farm on Furrowcast');
		const token = (await linkInMail(email.toLowerCase(), '/invitations/')).split('/').pop()!;
		expect(token).toMatch(/^[A-Za-z0-9_-]{43}$/);

		const row = await db.query.invitations.findFirst({ where: eq(invitations.id, invitation.id) });
		expect(row?.tokenHash).toBe(sha256(token));
		expect(JSON.stringify(row)).not.toContain(token);
		const entries = await db.select().from(auditLog).where(eq(auditLog.farmId, farmId));
		expect(entries.find((e) => e.action === 'invitation.created')?.detail).toEqual({
			invitationId: invitation.id,
			email: email.toLowerCase(),
			role: 'editor'
		});
	});

	it('lists the farm’s invitations for its owner, without tokens', async () => {
		const { id, token } = await invited();
		const response = await owner.fetch(`/api/v1/farms/${farmId}/invitations`);
		expect(response.status).toBe(200);
		const body = await response.text();
		expect(body).not.toContain(token);
		const { invitations: list } = JSON.parse(body);
		expect(list.find((i: { id: string }) => i.id === id)).toMatchObject({ status: 'pending' });
	});

	it('refuses a bad body, a member’s address and a second waiting invitation, saving nothing', async () => {
		const { email } = await invited();
		await changesNothing(async () => {
			const bad = await invite(owner, farmId, 'not-an-address', 'owner');
			expect(bad.status).toBe(422);
			expect((await bad.json()).issues.map((i: { path: string }) => i.path).sort()).toEqual([
				'email',
				'role'
			]);
			expect((await invite(owner, farmId, email)).status).toBe(409);
			expect((await invite(owner, farmId, ownerEmail)).status).toBe(409);
			expect((await owner.json(`/api/v1/farms/${farmId}/invitations`, 'POST', '{')).status).toBe(
				400
			);
		});
	});

	it('refuses anyone but an owner: 403 for an editor, 404 for a non-member, 401 signed out', async () => {
		const { id } = await invited();
		const [{ userId: ownerId }] = await db
			.select({ userId: users.id })
			.from(users)
			.where(eq(users.email, ownerEmail));
		await changesNothing(async () => {
			expect((await invite(editor, farmId, uniqueEmail('by-editor'))).status).toBe(403);
			expect((await invite(otherOwner, farmId, uniqueEmail('by-stranger'))).status).toBe(404);
			expect((await invite(new Client(), farmId, uniqueEmail('by-nobody'))).status).toBe(401);
			expect((await editor.fetch(`/api/v1/farms/${farmId}/invitations`)).status).toBe(403);
			const revoke = `/api/v1/farms/${farmId}/invitations/${id}`;
			expect((await editor.fetch(revoke, { method: 'DELETE' })).status).toBe(403);
			expect((await otherOwner.fetch(revoke, { method: 'DELETE' })).status).toBe(404);
			const remove = `/api/v1/farms/${farmId}/members/${ownerId}`;
			expect((await editor.fetch(remove, { method: 'DELETE' })).status).toBe(403);
			expect((await otherOwner.fetch(remove, { method: 'DELETE' })).status).toBe(404);
			// The members page and its form actions too.
			expect((await editor.fetch(`/farms/${farmId}/members`, html)).status).toBe(403);
			const inviteForm = await editor.postForm(`/farms/${farmId}/members?/invite`, {
				email: uniqueEmail('page-editor'),
				role: 'reviewer'
			});
			expect(inviteForm.status).toBe(403);
			const revokeForm = await editor.postForm(`/farms/${farmId}/members?/revokeInvitation`, {
				invitationId: id
			});
			expect(revokeForm.status).toBe(403);
		});
	});
});

describe('following the link', () => {
	it('shows an anonymous invitee the farm and the way to sign up, changing nothing', async () => {
		const { email, path } = await invited();
		await changesNothing(async () => {
			const page = await new Client().fetch(path, html);
			expect(page.status).toBe(200);
			const text = await page.text();
			expect(text).toContain('Invitation Test Farm');
			// Sign-up comes back to the link, with the invited address filled in.
			const register = new URLSearchParams({ redirectTo: path, email }).toString();
			expect(text).toContain(`/register?${register.replaceAll('&', '&amp;')}`);
			expect(text).toContain(email);
		});
	});

	it('adds the membership after sign-up, marks the invitation used and logs it', async () => {
		const { email, id, path } = await invited('reviewer');
		const invitee = await accountFor(email);
		const response = await invitee.postForm(path, {});
		expect(response.status).toBe(303);
		expect(response.headers.get('location')).toBe(`/farms/${farmId}?joined=1`);
		const farm = await invitee.fetch(`/api/v1/farms/${farmId}`);
		expect(farm.status).toBe(200);
		expect((await farm.json()).role).toBe('reviewer');
		const row = await db.query.invitations.findFirst({ where: eq(invitations.id, id) });
		expect(row?.acceptedAt).toBeInstanceOf(Date);
		const entries = await db.select().from(auditLog).where(eq(auditLog.farmId, farmId));
		expect(
			entries.find(
				(e) =>
					e.action === 'invitation.accepted' &&
					(e.detail as { invitationId?: string }).invitationId === id
			)?.userId
		).toBe(row?.acceptedById);
	});

	it('refuses a used link: 410, nothing changes', async () => {
		const { email, path } = await invited('editor');
		const invitee = await accountFor(email);
		expect((await invitee.postForm(path, {})).status).toBe(303);
		await changesNothing(async () => {
			const again = await invitee.postForm(path, {});
			expect(again.status).toBe(410);
			expect(await again.text()).toContain('already been used');
			expect((await new Client().fetch(path, html)).status).toBe(410);
		});
	});

	it('refuses an expired link: 410, nothing changes', async () => {
		const { email, id, path } = await invited();
		await db
			.update(invitations)
			.set({ expiresAt: new Date(Date.now() - 1000) })
			.where(eq(invitations.id, id));
		const invitee = await accountFor(email);
		await changesNothing(async () => {
			const page = await invitee.fetch(path, html);
			expect(page.status).toBe(410);
			expect(await page.text()).toContain('expired');
			expect((await invitee.postForm(path, {})).status).toBe(410);
		});
		expect((await invitee.fetch(`/api/v1/farms/${farmId}`)).status).toBe(404);
	});

	it('refuses forged and altered tokens: 404, nothing changes', async () => {
		const { email, token } = await invited();
		const invitee = await accountFor(email);
		const altered = (token[0] === 'A' ? 'B' : 'A') + token.slice(1);
		const forged = randomBytes(32).toString('base64url');
		await changesNothing(async () => {
			for (const bad of [altered, forged, token.slice(0, -1), `${token}x`, 'abc', '%00']) {
				const page = await invitee.fetch(`/invitations/${bad}`, html);
				expect(page.status).toBe(404);
				expect((await invitee.postForm(`/invitations/${bad}`, {})).status).toBe(404);
			}
			// Nor does the token's stored hash work as a token.
			expect((await invitee.postForm(`/invitations/${sha256(token)}`, {})).status).toBe(404);
		});
		expect((await invitee.fetch(`/api/v1/farms/${farmId}`)).status).toBe(404);
	});

	it('refuses a signed-in account with another e-mail: 403, nothing changes', async () => {
		const { path } = await invited();
		const { client: someoneElse } = await registerUser('wrong-address');
		await changesNothing(async () => {
			const page = await someoneElse.fetch(path, html);
			expect(page.status).toBe(200);
			expect((await page.text()).replace(/\s+/g, ' ')).toContain('but this invitation is for');
			expect((await someoneElse.postForm(path, {})).status).toBe(403);
		});
	});

	it('asks a signed-out visitor to sign in before joining', async () => {
		const { path } = await invited();
		await changesNothing(async () => {
			const response = await new Client().postForm(path, {});
			expect(response.status).toBe(303);
			expect(response.headers.get('location')).toBe(
				`/signin?redirectTo=${encodeURIComponent(path)}`
			);
		});
	});

	it('gives a token of another farm that farm only, and its id is no invitation here', async () => {
		const { email, id, path } = await invited('reviewer', otherFarmId, otherOwner);
		await changesNothing(async () => {
			const response = await owner.fetch(`/api/v1/farms/${farmId}/invitations/${id}`, {
				method: 'DELETE'
			});
			expect(response.status).toBe(404);
		});
		const invitee = await accountFor(email);
		expect((await invitee.postForm(path, {})).headers.get('location')).toBe(
			`/farms/${otherFarmId}?joined=1`
		);
		expect((await invitee.fetch(`/api/v1/farms/${farmId}`)).status).toBe(404);
	});
});

describe('revoking', () => {
	it('revokes an invitation: its link then refuses (410) and a second revoke is 409', async () => {
		const { email, id, path } = await invited();
		const response = await owner.fetch(`/api/v1/farms/${farmId}/invitations/${id}`, {
			method: 'DELETE'
		});
		expect(response.status).toBe(200);
		expect((await response.json()).invitation.status).toBe('revoked');
		const entries = await db.select().from(auditLog).where(eq(auditLog.farmId, farmId));
		expect(
			entries.some(
				(e) =>
					e.action === 'invitation.revoked' &&
					(e.detail as { invitationId?: string }).invitationId === id
			)
		).toBe(true);

		const invitee = await accountFor(email);
		await changesNothing(async () => {
			const page = await invitee.fetch(path, html);
			expect(page.status).toBe(410);
			expect(await page.text()).toContain('withdrawn');
			expect((await invitee.postForm(path, {})).status).toBe(410);
			const again = await owner.fetch(`/api/v1/farms/${farmId}/invitations/${id}`, {
				method: 'DELETE'
			});
			expect(again.status).toBe(409);
			expect(
				(await owner.fetch(`/api/v1/farms/${farmId}/invitations/not-a-uuid`, { method: 'DELETE' }))
					.status
			).toBe(404);
		});
		expect((await invitee.fetch(`/api/v1/farms/${farmId}`)).status).toBe(404);
	});

	it('revokes through the members page form', async () => {
		const { id } = await invited();
		const result = await owner.action(`/farms/${farmId}/members?/revokeInvitation`, {
			invitationId: id
		});
		expect(result).toMatchObject({ type: 'redirect', status: 303 });
		const row = await db.query.invitations.findFirst({ where: eq(invitations.id, id) });
		expect(row?.revokedAt).toBeInstanceOf(Date);
	});

	it('removes a member, who then gets 404 for the farm; logs it', async () => {
		const { email, path } = await invited('reviewer');
		const member = await accountFor(email);
		expect((await member.postForm(path, {})).status).toBe(303);
		const [{ id: memberId }] = await db
			.select({ id: users.id })
			.from(users)
			.where(eq(users.email, email));

		const list = await owner.fetch(`/api/v1/farms/${farmId}/members`);
		expect((await list.json()).members.map((m: { email: string }) => m.email)).toContain(email);

		const response = await owner.fetch(`/api/v1/farms/${farmId}/members/${memberId}`, {
			method: 'DELETE'
		});
		expect(response.status).toBe(200);
		expect(await response.json()).toEqual({
			removed: { userId: memberId, email, role: 'reviewer' }
		});
		expect((await member.fetch(`/api/v1/farms/${farmId}`)).status).toBe(404);
		expect((await member.fetch(`/farms/${farmId}`, html)).status).toBe(404);
		const entries = await db.select().from(auditLog).where(eq(auditLog.farmId, farmId));
		expect(
			entries.find(
				(e) =>
					e.action === 'member.removed' && (e.detail as { memberId?: string }).memberId === memberId
			)?.detail
		).toEqual({ memberId, email, role: 'reviewer' });
		// The old link does not bring them back.
		await changesNothing(async () => {
			expect((await member.postForm(path, {})).status).toBe(410);
			expect(
				(await owner.fetch(`/api/v1/farms/${farmId}/members/${memberId}`, { method: 'DELETE' }))
					.status
			).toBe(404);
		});
	});

	it('never removes the farm’s last owner', async () => {
		const [{ id: ownerId }] = await db
			.select({ id: users.id })
			.from(users)
			.where(eq(users.email, ownerEmail));
		await changesNothing(async () => {
			const response = await owner.fetch(`/api/v1/farms/${farmId}/members/${ownerId}`, {
				method: 'DELETE'
			});
			expect(response.status).toBe(409);
			expect((await response.json()).message).toContain('at least one owner');
			const action = await owner.action(`/farms/${farmId}/members?/removeMember`, {
				userId: ownerId
			});
			expect(action).toMatchObject({ type: 'failure', status: 400 });
		});
	});
});

describe('the captured mail', () => {
	it('is for site admins only: 401 signed out, 403 for anyone else', async () => {
		expect((await new Client().fetch('/api/v1/admin/mail')).status).toBe(401);
		expect((await owner.fetch('/api/v1/admin/mail')).status).toBe(403);
		expect((await owner.fetch('/admin/mail', html)).status).toBe(403);
	});
});
