import { eq } from 'drizzle-orm';
import { db } from '.';
import { auditLog, users } from './schema';

export async function findUserByEmail(email: string) {
	return db.query.users.findFirst({ where: eq(users.email, email) });
}

export async function findSessionUser(id: string) {
	return db.query.users.findFirst({
		where: eq(users.id, id),
		columns: { id: true, email: true, name: true, isSiteAdmin: true }
	});
}

/** Creates an account; null when the e-mail is already taken. */
export async function createUser(input: { name: string; email: string; passwordHash: string }) {
	return db.transaction(async (tx) => {
		const [user] = await tx
			.insert(users)
			.values(input)
			.onConflictDoNothing({ target: users.email })
			.returning({ id: users.id });
		if (!user) return null;
		await tx.insert(auditLog).values({ userId: user.id, action: 'user.registered' });
		return user;
	});
}

export async function listUsers() {
	return db.query.users.findMany({
		columns: { id: true, email: true, name: true, isSiteAdmin: true, createdAt: true },
		orderBy: users.email
	});
}
