import { and, desc, eq, gt, isNull, sql } from 'drizzle-orm';
import { alias } from 'drizzle-orm/pg-core';
import type { FarmRole } from '$lib/roles';
import type { InvitableRole } from '$lib/schemas/invitations';
import {
	hashInvitationToken,
	invitationExpiry,
	invitationStatus,
	newInvitationToken,
	type InvitationStatus
} from '$lib/server/invitations';
import { insertAuditEntry } from './audit';
import { readAll, type Db, type Tx } from './client';
import { lockFarm } from './people';
import { farms, invitations, memberships, users } from './schema';

const inviter = alias(users, 'inviter');

const invitationColumns = {
	id: invitations.id,
	email: invitations.email,
	role: invitations.role,
	createdAt: invitations.createdAt,
	expiresAt: invitations.expiresAt,
	acceptedAt: invitations.acceptedAt,
	revokedAt: invitations.revokedAt,
	invitedByName: inviter.name,
	invitedByEmail: inviter.email
};

type InvitationRow = {
	id: string;
	email: string;
	role: FarmRole;
	createdAt: Date;
	expiresAt: Date;
	acceptedAt: Date | null;
	revokedAt: Date | null;
	invitedByName: string | null;
	invitedByEmail: string | null;
};

/** An invitation as the API and the members page show it: its status, never its token. */
export function invitationView(row: InvitationRow, now = new Date()) {
	return {
		id: row.id,
		email: row.email,
		role: row.role,
		status: invitationStatus(row, now),
		invitedBy: row.invitedByEmail ? { name: row.invitedByName, email: row.invitedByEmail } : null,
		createdAt: row.createdAt,
		expiresAt: row.expiresAt,
		acceptedAt: row.acceptedAt,
		revokedAt: row.revokedAt
	};
}
export type InvitationView = ReturnType<typeof invitationView>;

/** Every invitation of the farm, newest first. */
export async function listInvitations(db: Db | Tx, farmId: string) {
	const rows = await db
		.select(invitationColumns)
		.from(invitations)
		.leftJoin(inviter, eq(inviter.id, invitations.invitedById))
		.where(eq(invitations.farmId, farmId))
		.orderBy(desc(invitations.createdAt), desc(invitations.id));
	const now = new Date();
	return rows.map((row) => invitationView(row, now));
}

export type CreateInvitationResult =
	| { ok: true; invitation: InvitationView; token: string }
	| { ok: false; refused: 'member' | 'pending' };

/**
 * Records an invitation (the token's hash only) and its audit entry, then runs `send` with the token
 * while the transaction is still open: when the mail cannot be sent, nothing is saved. Refused when
 * the address already belongs to a member, or has an invitation still waiting.
 */
export async function createInvitation(
	db: Db,
	input: { farmId: string; email: string; role: InvitableRole; invitedById: string },
	send: (token: string, invitation: InvitationView) => Promise<void>
): Promise<CreateInvitationResult> {
	return db.transaction(async (tx) => {
		await lockFarm(tx, input.farmId);
		const now = new Date();
		const [member, waiting] = await readAll(tx, [
			() =>
				tx
					.select({ userId: memberships.userId })
					.from(memberships)
					.innerJoin(users, eq(users.id, memberships.userId))
					.where(and(eq(memberships.farmId, input.farmId), eq(users.email, input.email))),
			() =>
				tx
					.select({ id: invitations.id })
					.from(invitations)
					.where(
						and(
							eq(invitations.farmId, input.farmId),
							eq(invitations.email, input.email),
							isNull(invitations.acceptedAt),
							isNull(invitations.revokedAt),
							gt(invitations.expiresAt, now)
						)
					)
		]);
		if (member.length) return { ok: false, refused: 'member' } as const;
		if (waiting.length) return { ok: false, refused: 'pending' } as const;

		const { token, tokenHash } = newInvitationToken();
		const [row] = await tx
			.insert(invitations)
			.values({ ...input, tokenHash, expiresAt: invitationExpiry(now) })
			.returning({ id: invitations.id });
		await insertAuditEntry(tx, {
			farmId: input.farmId,
			userId: input.invitedById,
			action: 'invitation.created',
			detail: { invitationId: row.id, email: input.email, role: input.role }
		});
		const [saved] = await tx
			.select(invitationColumns)
			.from(invitations)
			.leftJoin(inviter, eq(inviter.id, invitations.invitedById))
			.where(eq(invitations.id, row.id));
		const invitation = invitationView(saved, now);
		await send(token, invitation);
		return { ok: true, invitation, token };
	});
}

/** Withdraws a waiting (or expired) invitation; refused once it has been used or withdrawn. */
export async function revokeInvitation(
	db: Db,
	farmId: string,
	invitationId: string,
	userId: string
): Promise<
	{ ok: true; invitation: InvitationView } | { ok: false; refused: 'not-found' | 'closed' }
> {
	return db.transaction(async (tx) => {
		const [row] = await tx
			.select({
				id: invitations.id,
				email: invitations.email,
				role: invitations.role,
				acceptedAt: invitations.acceptedAt,
				revokedAt: invitations.revokedAt
			})
			.from(invitations)
			.where(and(eq(invitations.farmId, farmId), eq(invitations.id, invitationId)))
			.for('update');
		if (!row) return { ok: false, refused: 'not-found' } as const;
		if (row.acceptedAt || row.revokedAt) return { ok: false, refused: 'closed' } as const;
		await tx
			.update(invitations)
			.set({ revokedAt: sql`now()`, revokedById: userId })
			.where(eq(invitations.id, row.id));
		await insertAuditEntry(tx, {
			farmId,
			userId,
			action: 'invitation.revoked',
			detail: { invitationId: row.id, email: row.email, role: row.role }
		});
		const [saved] = await tx
			.select(invitationColumns)
			.from(invitations)
			.leftJoin(inviter, eq(inviter.id, invitations.invitedById))
			.where(eq(invitations.id, row.id));
		return { ok: true, invitation: invitationView(saved) } as const;
	});
}

/** The invitation a link's token stands for, with its farm's name; undefined for any other token. */
export async function findInvitationByToken(db: Db | Tx, token: string) {
	const [row] = await db
		.select({
			...invitationColumns,
			farmId: invitations.farmId,
			farmName: farms.name
		})
		.from(invitations)
		.innerJoin(farms, eq(farms.id, invitations.farmId))
		.leftJoin(inviter, eq(inviter.id, invitations.invitedById))
		.where(eq(invitations.tokenHash, hashInvitationToken(token)));
	return row && { ...row, status: invitationStatus(row, new Date()) };
}

export type AcceptInvitationResult =
	| { ok: true; farmId: string; role: FarmRole; alreadyMember: boolean }
	| { ok: false; refused: InvitationStatus | 'invalid' | 'other-email' };

/**
 * Uses an invitation: the signed-in user (whose e-mail must be the one invited) becomes a member with
 * the invited role, the invitation is marked used, and the log says so, together. A user who is a
 * member already keeps the role they have. Any other state of the invitation changes nothing.
 */
export async function acceptInvitation(
	db: Db,
	token: string,
	user: { id: string; email: string }
): Promise<AcceptInvitationResult> {
	return db.transaction(async (tx) => {
		const [row] = await tx
			.select({
				id: invitations.id,
				farmId: invitations.farmId,
				email: invitations.email,
				role: invitations.role,
				expiresAt: invitations.expiresAt,
				acceptedAt: invitations.acceptedAt,
				revokedAt: invitations.revokedAt
			})
			.from(invitations)
			.where(eq(invitations.tokenHash, hashInvitationToken(token)))
			.for('update');
		if (!row) return { ok: false, refused: 'invalid' } as const;
		const status = invitationStatus(row, new Date());
		if (status !== 'pending') return { ok: false, refused: status } as const;
		if (row.email !== user.email.toLowerCase())
			return { ok: false, refused: 'other-email' } as const;

		const [added] = await tx
			.insert(memberships)
			.values({ farmId: row.farmId, userId: user.id, role: row.role })
			.onConflictDoNothing()
			.returning({ role: memberships.role });
		await tx
			.update(invitations)
			.set({ acceptedAt: sql`now()`, acceptedById: user.id })
			.where(eq(invitations.id, row.id));
		await insertAuditEntry(tx, {
			farmId: row.farmId,
			userId: user.id,
			action: 'invitation.accepted',
			detail: { invitationId: row.id, email: row.email, role: row.role }
		});
		return { ok: true, farmId: row.farmId, role: row.role, alreadyMember: !added } as const;
	});
}
