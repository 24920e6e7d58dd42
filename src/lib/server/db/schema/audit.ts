import { bigserial, index, jsonb, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core';
import { users } from './auth';
import { farms } from './farms';

/** What each audited action records beside its farm and user. */
export interface AuditDetails {
	'user.registered': Record<string, never>;
	'farm.created': Record<string, never>;
	'farm.updated': Record<string, never>;
	'plan.imported': { planId: string; name: string };
	'field.created': { fieldId: string; name: string };
	'field.updated': { fieldId: string; name: string };
	'field.deleted': { fieldId: string; name: string };
	'crop.created': { crop: string; name: string };
	'crop.updated': { crop: string; name: string };
	'crop.deleted': { crop: string; name: string };
	'herd.updated': { head: number };
	'herd.deleted': Record<string, never>;
	'person.created': { personId: string; name: string };
	'person.updated': { personId: string; name: string };
	'person.deleted': { personId: string; name: string };
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
