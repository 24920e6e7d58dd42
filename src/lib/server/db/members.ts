import { and, count, eq } from 'drizzle-orm';
import type { FarmRole } from '$lib/roles';
import { insertAuditEntry } from './audit';
import type { Db, Tx } from './client';
import { lockFarm } from './people';
import { memberships, users } from './schema';

/** The farm's members with their ids, owners first: what the members page and API list. */
export async function listFarmMembers(db: Db | Tx, farmId: string) {
	return db
		.select({
			userId: users.id,
			name: users.name,
			email: users.email,
			role: memberships.role,
			since: memberships.createdAt
		})
		.from(memberships)
		.innerJoin(users, eq(users.id, memberships.userId))
		.where(eq(memberships.farmId, farmId))
		.orderBy(memberships.role, users.email);
}

export type RemoveMemberResult =
	| { ok: true; removed: { userId: string; email: string; role: FarmRole } }
	| { ok: false; refused: 'not-found' | 'last-owner' };

/** Takes someone off the farm, with the audit entry; never the farm's last owner. */
export async function removeMember(
	db: Db,
	farmId: string,
	memberId: string,
	byUserId: string
): Promise<RemoveMemberResult> {
	return db.transaction(async (tx) => {
		// The farm row's lock keeps two owners from removing each other at once.
		await lockFarm(tx, farmId);
		const [member] = await tx
			.select({ userId: users.id, email: users.email, role: memberships.role })
			.from(memberships)
			.innerJoin(users, eq(users.id, memberships.userId))
			.where(and(eq(memberships.farmId, farmId), eq(memberships.userId, memberId)));
		if (!member) return { ok: false, refused: 'not-found' } as const;
		if (member.role === 'owner') {
			const [owners] = await tx
				.select({ n: count() })
				.from(memberships)
				.where(and(eq(memberships.farmId, farmId), eq(memberships.role, 'owner')));
			if (owners.n <= 1) return { ok: false, refused: 'last-owner' } as const;
		}
		await tx
			.delete(memberships)
			.where(and(eq(memberships.farmId, farmId), eq(memberships.userId, memberId)));
		await insertAuditEntry(tx, {
			farmId,
			userId: byUserId,
			action: 'member.removed',
			detail: { memberId: member.userId, email: member.email, role: member.role }
		});
		return { ok: true, removed: member } as const;
	});
}
