import { bigserial, index, jsonb, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core';
import type { FarmRole } from '../../../roles';
import { users } from './auth';
import { farms } from './farms';

/** What each audited action records beside its farm and user. */
export interface AuditDetails {
	'user.registered': Record<string, never>;
	'farm.created': Record<string, never>;
	'farm.updated': Record<string, never>;
	'plan.imported': { planId: string; name: string };
	'plan.created': { planId: string; name: string };
	'plan.saved': { planId: string; name: string; version: number };
	'plan.deleted': { planId: string; name: string };
	'plan.restored': { planId: string; name: string; version: number; fromVersion: number };
	'plan.shared': { planId: string; name: string; version: number };
	'plan.reviewed': {
		planId: string;
		name: string;
		version: number;
		/** A comment alone, or the decision it came with. */
		kind: 'comment' | 'approved' | 'changes_requested';
	};
	'plan.made-reference': { planId: string; name: string };
	'field.created': { fieldId: string; name: string };
	'field.updated': { fieldId: string; name: string };
	'field.deleted': { fieldId: string; name: string };
	'fields.imported': { count: number; names: string[] };
	'crop.created': { crop: string; name: string };
	'crop.updated': { crop: string; name: string };
	'crop.deleted': { crop: string; name: string };
	'price-set.created': { priceSetId: string; year: number };
	'price-set.updated': { priceSetId: string; year: number };
	'price-set.deleted': { priceSetId: string; year: number };
	'operation.created': { operationId: string; name: string };
	'operation.updated': { operationId: string; name: string };
	'operation.deleted': { operationId: string; name: string };
	'practice.created': { practiceId: string; name: string };
	'practice.updated': { practiceId: string; name: string };
	'practice.deleted': { practiceId: string; name: string };
	'rotation.created': { rotationId: string; name: string };
	'rotation.updated': { rotationId: string; name: string };
	'rotation.deleted': { rotationId: string; name: string };
	'herd.updated': { head: number };
	'herd.deleted': Record<string, never>;
	'person.created': { personId: string; name: string };
	'person.updated': { personId: string; name: string };
	'person.deleted': { personId: string; name: string };
	'cash-flow-settings.updated': Record<string, never>;
	'invitation.created': InvitationDetail;
	'invitation.revoked': InvitationDetail;
	'invitation.accepted': InvitationDetail;
	'member.removed': { memberId: string; email: string; role: FarmRole };
}

/** An invitation in the log: which one, to whom, for what role. */
interface InvitationDetail {
	invitationId: string;
	email: string;
	role: FarmRole;
}
export type AuditAction = keyof AuditDetails;

export const auditLog = pgTable(
	'audit_log',
	{
		id: bigserial({ mode: 'number' }).primaryKey(),
		farmId: uuid().references(() => farms.id, { onDelete: 'cascade' }),
		userId: uuid().references(() => users.id, { onDelete: 'set null' }),
		action: text().$type<AuditAction>().notNull(),
		detail: jsonb().$type<AuditDetails[AuditAction]>().notNull().default({}),
		createdAt: timestamp({ withTimezone: true }).notNull().defaultNow()
	},
	(t) => [index().on(t.farmId, t.createdAt)]
);
