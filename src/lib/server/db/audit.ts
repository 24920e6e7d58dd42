import type { Db, Tx } from './client';
import { auditLog, type AuditAction, type AuditDetails } from './schema';

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
