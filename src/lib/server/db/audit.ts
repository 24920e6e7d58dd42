import type { Db, Tx } from './client';
import { auditLog, type AuditAction, type AuditDetails } from './schema';

/** Records who did what; each action's detail has the shape `AuditDetails` gives it. */
export async function insertAuditEntry<A extends AuditAction>(
	db: Db | Tx,
	entry: { farmId?: string; userId: string | null; action: A; detail?: AuditDetails[A] }
) {
	await db.insert(auditLog).values(entry);
}
