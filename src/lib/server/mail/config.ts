// Where mail goes, read from the environment. Development and tests point SMTP_HOST/SMTP_PORT at the
// local sink (scripts/mail-sink.ts, port written to .env by scripts/lib/bootstrap.sh); production
// points them at a real SMTP server. Nothing else changes between the two.
import type SMTPTransport from 'nodemailer/lib/smtp-transport';

export interface MailConfig {
	transport: SMTPTransport.Options;
	from: string;
}

export const DEFAULT_MAIL_FROM = 'Furrowcast <no-reply@furrowcast.test>';

type Env = Record<string, string | undefined>;

/**
 * SMTP_HOST (default 127.0.0.1), SMTP_PORT (default 2525), SMTP_SECURE (`true` for TLS from the first
 * byte, as on port 465; otherwise STARTTLS when the server offers it), SMTP_USER and SMTP_PASSWORD
 * (both or neither), MAIL_FROM (the From address).
 */
export function mailConfigFrom(env: Env): MailConfig {
	const port = Number(env.SMTP_PORT || 2525);
	if (!Number.isInteger(port) || port < 1 || port > 65535) {
		throw new Error(`SMTP_PORT must be a port number from 1 to 65535, not "${env.SMTP_PORT}".`);
	}
	const user = env.SMTP_USER || undefined;
	const pass = env.SMTP_PASSWORD || undefined;
	if (Boolean(user) !== Boolean(pass)) {
		throw new Error('Set both SMTP_USER and SMTP_PASSWORD, or neither.');
	}
	return {
		transport: {
			host: env.SMTP_HOST || '127.0.0.1',
			port,
			secure: env.SMTP_SECURE === 'true',
			auth: user && pass ? { user, pass } : undefined,
			// A mail server that does not answer must not hold a request for minutes.
			connectionTimeout: 10_000,
			greetingTimeout: 10_000,
			socketTimeout: 20_000
		},
		from: env.MAIL_FROM || DEFAULT_MAIL_FROM
	};
}
