// People and sign-in. Auth.js tables keep the names its Drizzle adapter expects.
import { relations } from 'drizzle-orm';
import {
	bigint,
	boolean,
	integer,
	pgTable,
	primaryKey,
	text,
	timestamp,
	uuid,
	varchar
} from 'drizzle-orm/pg-core';
import { timestamps } from './columns';
import { memberships } from './farms';

export const users = pgTable('users', {
	id: uuid().primaryKey().defaultRandom(),
	name: text(),
	email: text().notNull().unique(),
	emailVerified: timestamp({ withTimezone: true, mode: 'date' }),
	image: text(),
	/** argon2id hash; null for people who have only been invited. */
	passwordHash: text(),
	isSiteAdmin: boolean().notNull().default(false),
	...timestamps
});

export const usersRelations = relations(users, ({ many }) => ({ memberships: many(memberships) }));

export const accounts = pgTable(
	'accounts',
	{
		userId: uuid()
			.notNull()
			.references(() => users.id, { onDelete: 'cascade' }),
		type: text().$type<'email' | 'oauth' | 'oidc' | 'webauthn'>().notNull(),
		provider: text().notNull(),
		providerAccountId: text().notNull(),
		refresh_token: text('refresh_token'),
		access_token: text('access_token'),
		expires_at: integer('expires_at'),
		token_type: text('token_type'),
		scope: text(),
		id_token: text('id_token'),
		session_state: text('session_state')
	},
	(t) => [primaryKey({ columns: [t.provider, t.providerAccountId] })]
);

export const sessions = pgTable('sessions', {
	sessionToken: text().primaryKey(),
	userId: uuid()
		.notNull()
		.references(() => users.id, { onDelete: 'cascade' }),
	expires: timestamp({ withTimezone: true, mode: 'date' }).notNull()
});

export const verificationTokens = pgTable(
	'verification_tokens',
	{
		identifier: text().notNull(),
		token: text().notNull(),
		expires: timestamp({ withTimezone: true, mode: 'date' }).notNull()
	},
	(t) => [primaryKey({ columns: [t.identifier, t.token] })]
);

/** Failed sign-in counters, the table rate-limiter-flexible's PostgreSQL store reads and writes. */
export const signInLimits = pgTable('sign_in_limits', {
	key: varchar({ length: 255 }).primaryKey(),
	points: integer().notNull().default(0),
	expire: bigint({ mode: 'number' })
});
