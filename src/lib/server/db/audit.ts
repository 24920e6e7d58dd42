import { and, desc, eq, lt, sql } from 'drizzle-orm';
import { readAll, type Db, type Tx } from './client';
import { auditLog, users, type AuditAction, type AuditDetails } from './schema';

/** An audit entry: an action with a detail of its own shape, given exactly when it has one. */
type AuditEntry<A extends AuditAction> = {
	farmId?: string;
	userId: string | null;
	action: A;
} & (AuditDetails[A] extends Record<string, never>
	? { detail?: never }
	: { detail: AuditDetails[A] });

/** Records who did what. */
export async function insertAuditEntry<A extends AuditAction>(db: Db | Tx, entry: AuditEntry<A>) {
	await db.insert(auditLog).values(entry);
}

/** Filters of the farm's record: one person's entries, one plan's entries, older than an entry. */
export interface AuditFilter {
	userId?: string;
	planId?: string;
	/** Entries older than this one (the next page). */
	beforeId?: number;
	limit: number;
}

/** The farm's audit entries, newest first, with who did each (name, else e-mail). */
export async function listAuditEntries(db: Db | Tx, farmId: string, filter: AuditFilter) {
	const rows = await db
		.select({
			id: auditLog.id,
			action: auditLog.action,
			detail: auditLog.detail,
			at: auditLog.createdAt,
			userId: auditLog.userId,
			name: users.name,
			email: users.email
		})
		.from(auditLog)
		.leftJoin(users, eq(users.id, auditLog.userId))
		.where(
			and(
				eq(auditLog.farmId, farmId),
				filter.userId ? eq(auditLog.userId, filter.userId) : undefined,
				filter.planId ? sql`${auditLog.detail}->>'planId' = ${filter.planId}` : undefined,
				filter.beforeId ? lt(auditLog.id, filter.beforeId) : undefined
			)
		)
		.orderBy(desc(auditLog.id))
		.limit(filter.limit);
	return rows.map(({ name, email, ...row }) => ({
		...row,
		by: name ?? email ?? (row.userId ? 'a removed account' : 'Furrowcast')
	}));
}

/** Who appears in the farm's record and which plans it names (by their last recorded name), to filter by. */
export async function listAuditFilters(db: Db | Tx, farmId: string) {
	const [people, plans] = await readAll(db, [
		() =>
			db
				.selectDistinct({ id: users.id, name: users.name, email: users.email })
				.from(auditLog)
				.innerJoin(users, eq(users.id, auditLog.userId))
				.where(eq(auditLog.farmId, farmId)),
		() =>
			db
				.select({
					id: sql<string>`${auditLog.detail}->>'planId'`,
					name: sql<string>`(array_agg(${auditLog.detail}->>'name' order by ${auditLog.id} desc))[1]`
				})
				.from(auditLog)
				.where(and(eq(auditLog.farmId, farmId), sql`${auditLog.detail} ? 'planId'`))
				.groupBy(sql`${auditLog.detail}->>'planId'`)
	]);
	return {
		people: people
			.map((p) => ({ id: p.id, name: p.name ?? p.email }))
			.sort((a, b) => a.name.localeCompare(b.name) || a.id.localeCompare(b.id)),
		plans: plans.sort((a, b) => a.name.localeCompare(b.name) || a.id.localeCompare(b.id))
	};
}
