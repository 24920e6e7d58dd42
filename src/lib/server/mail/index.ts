// The one way the app sends mail: `sendMail`. The transport is made once, from the environment.
import { env } from '$env/dynamic/private';
import nodemailer, { type Transporter } from 'nodemailer';
import { mailConfigFrom, type MailConfig } from './config';

export interface OutgoingMail {
	/** One address, or several. */
	to: string | string[];
	subject: string;
	text: string;
	html?: string;
}

let configured: { config: MailConfig; transporter: Transporter } | undefined;

function transport() {
	if (!configured) {
		const config = mailConfigFrom(env);
		configured = { config, transporter: nodemailer.createTransport(config.transport) };
	}
	return configured;
}

/** Sends one message through the configured SMTP server; rejects when the server refuses it. */
export async function sendMail({ to, subject, text, html }: OutgoingMail): Promise<void> {
	const { config, transporter } = transport();
	await transporter.sendMail({ from: config.from, to, subject, text, html });
}

export { invitationMail, signInLinkMail } from './templates';
