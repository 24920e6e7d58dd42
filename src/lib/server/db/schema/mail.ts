// Mail caught by the local SMTP sink (scripts/mail-sink.ts) in development and tests, for the admin's
// mail page. Production sends through a real SMTP server and this table stays empty.
import { index, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core';

export const capturedMail = pgTable(
	'captured_mail',
	{
		id: uuid().primaryKey().defaultRandom(),
		receivedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
		/** The SMTP envelope: who the message was really sent from and to. */
		envelopeFrom: text().notNull(),
		envelopeTo: text().array().notNull(),
		subject: text().notNull(),
		/** Decoded bodies (quoted-printable undone); html is null for a text-only message. */
		text: text().notNull(),
		html: text(),
		/** The message as it arrived, headers and encodings included. */
		raw: text().notNull()
	},
	(t) => [index().on(t.receivedAt)]
);
