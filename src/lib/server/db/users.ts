import { eq } from 'drizzle-orm';
import { insertAuditEntry } from './audit';
import type { Db, Tx } from './client';
import { users } from './schema';

export async function findUserByEmail(db: Db | Tx, email: string) {
	return db.query.users.findFirst({ where: eq(users.email, email) });
}

export async function findSessionUser(db: Db | Tx, id: string) {
	return db.query.users.findFirst({
		where: eq(users.id, id),
		columns: { id: true, email: true, name: true, isSiteAdmin: true }
	});
}

/** Creates an account and its audit entry in one transaction; null when the e-mail is already taken. */
export async function createUser(
	db: Db | Tx,
	input: { name: string; email: string; passwordHash: string }
) {
	return db.transaction(async (tx) => {
		const [user] = await tx
			.insert(users)
			.values(input)
			.onConflictDoNothing({ target: users.email })
			.returning({ id: users.id });
		if (!user) return null;
		await insertAuditEntry(tx, { userId: user.id, action: 'user.registered' });
		return user;
	});
}

export async function listUsers(db: Db | Tx) {
	return db.query.users.findMany({
		columns: { id: true, email: true, name: true, isSiteAdmin: true, createdAt: true },
		orderBy: users.email
	});
}
