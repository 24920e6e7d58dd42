// The local SMTP sink for development and tests: accepts every message on 127.0.0.1 and stores it in
// PostgreSQL (captured_mail), where a site admin reads it at /admin/mail or GET /api/v1/admin/mail.
// Started by `npm start` (scripts/start.sh) and by the tests (tests/support/test-servers.ts):
//   tsx scripts/mail-sink.ts --port N [--parent PID]
// It stops on SIGINT/SIGTERM, and by itself once the parent process (PID) has gone.
import './db/load-env';
import { parseArgs } from 'node:util';
import { simpleParser, type AddressObject } from 'mailparser';
import { SMTPServer } from 'smtp-server';
import { stopWithParent } from './lib/stop-with-parent';
import { createDb } from '../src/lib/server/db/client';
import { capturedMail } from '../src/lib/server/db/schema';

const { values } = parseArgs({
	options: { port: { type: 'string' }, parent: { type: 'string' } }
});
const port = Number(values.port ?? process.env.SMTP_PORT);
if (!Number.isInteger(port) || port < 1 || port > 65535) {
	throw new Error('mail sink: give the port with --port N (or SMTP_PORT)');
}
const url = process.env.DATABASE_URL;
if (!url) throw new Error('mail sink: DATABASE_URL is not set: run `npm start` once to write .env');

const { db, pool } = createDb(url);
// A message of more than 10 MB is refused, as many real servers do.
const MAX_BYTES = 10 * 1024 * 1024;

const server = new SMTPServer({
	name: 'furrowcast-mail-sink',
	banner: 'Furrowcast development mail sink: nothing is delivered',
	authOptional: true,
	disabledCommands: ['STARTTLS', 'AUTH'],
	size: MAX_BYTES,
	logger: false,
	onData(stream, session, callback) {
		const chunks: Buffer[] = [];
		stream.on('data', (chunk: Buffer) => chunks.push(chunk));
		stream.on('end', () => {
			if (stream.sizeExceeded) {
				callback(Object.assign(new Error('Message too large'), { responseCode: 552 }));
				return;
			}
			const raw = Buffer.concat(chunks);
			store(raw, session.envelope).then(
				() => callback(),
				(err: unknown) => {
					console.error('mail sink: could not store a message', err);
					callback(Object.assign(new Error('Could not store the message'), { responseCode: 451 }));
				}
			);
		});
	}
});

async function store(
	raw: Buffer,
	envelope: { mailFrom: false | { address: string }; rcptTo: { address: string }[] }
) {
	const parsed = await simpleParser(raw);
	const headerTo = ([] as AddressObject[]).concat(parsed.to ?? []).flatMap((a) => a.value);
	await db.insert(capturedMail).values({
		envelopeFrom: envelope.mailFrom ? envelope.mailFrom.address : '',
		envelopeTo: envelope.rcptTo.length
			? envelope.rcptTo.map((r) => r.address)
			: headerTo.map((a) => a.address ?? ''),
		subject: parsed.subject ?? '',
		text: parsed.text ?? '',
		html: parsed.html || null,
		raw: raw.toString('utf8')
	});
}

let stopping = false;
async function stop() {
	if (stopping) return;
	stopping = true;
	await new Promise<void>((resolve) => server.close(() => resolve()));
	await pool.end();
	process.exit(0);
}
process.on('SIGINT', stop);
process.on('SIGTERM', stop);

server.on('error', (err: NodeJS.ErrnoException) => {
	if (err.code === 'EADDRINUSE') {
		console.error(`mail sink: port ${port} is taken (is another sink of this checkout running?)`);
	} else console.error('mail sink:', err);
	void pool.end().finally(() => process.exit(1));
});

server.listen(port, '127.0.0.1', () => {
	console.log(`mail sink: listening on 127.0.0.1:${port}`);
});

stopWithParent(values.parent ? Number(values.parent) : undefined, () => void stop());
