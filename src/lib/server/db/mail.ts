import { arrayContains, desc } from 'drizzle-orm';
import type { Db, Tx } from './client';
import { capturedMail } from './schema';

/** Mail the local sink caught, newest first; `to` keeps the messages sent to that address. */
export async function listCapturedMail(db: Db | Tx, options: { to?: string; limit: number }) {
	return db
		.select({
			id: capturedMail.id,
			receivedAt: capturedMail.receivedAt,
			from: capturedMail.envelopeFrom,
			to: capturedMail.envelopeTo,
			subject: capturedMail.subject,
			text: capturedMail.text,
			html: capturedMail.html
		})
		.from(capturedMail)
		.where(options.to ? arrayContains(capturedMail.envelopeTo, [options.to]) : undefined)
		.orderBy(desc(capturedMail.receivedAt), desc(capturedMail.id))
		.limit(options.limit);
}
