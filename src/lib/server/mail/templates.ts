// The messages the app sends, each as plain text with a simple HTML twin. Pure: no I/O.
import { farmRoleLabels, type FarmRole } from '$lib/roles';

export interface MailContent {
	subject: string;
	text: string;
	html: string;
}

const escapeHtml = (value: string) =>
	value
		.replaceAll('&', '&amp;')
		.replaceAll('<', '&lt;')
		.replaceAll('>', '&gt;')
		.replaceAll('"', '&quot;')
		.replaceAll("'", '&#39;');

/** Paragraphs and one button-like link, in a layout every mail program shows. */
function htmlBody(paragraphs: string[], link: { href: string; label: string }, after: string[]) {
	const p = (text: string) => `<p style="margin:0 0 16px">${escapeHtml(text)}</p>`;
	return [
		'<div style="font-family:sans-serif;font-size:16px;line-height:1.5;color:#2b2118;max-width:560px">',
		...paragraphs.map(p),
		`<p style="margin:0 0 16px"><a href="${escapeHtml(link.href)}" style="display:inline-block;background:#3f6b35;color:#ffffff;padding:10px 18px;border-radius:4px;text-decoration:none">${escapeHtml(link.label)}</a></p>`,
		`<p style="margin:0 0 16px;font-size:14px">Or paste this address into your browser:<br>${escapeHtml(link.href)}</p>`,
		...after.map(p),
		'</div>'
	].join('\n');
}

const dateFormat = new Intl.DateTimeFormat('en-US', {
	dateStyle: 'long',
	timeStyle: 'short',
	timeZone: 'UTC'
});

/** The e-mailed sign-in link (Auth.js's e-mail provider makes the URL). */
export function signInLinkMail({ url, host }: { url: string; host: string }): MailContent {
	const subject = `Your sign-in link for Furrowcast`;
	const intro = `Someone (we hope you) asked to sign in to Furrowcast at ${host} with this e-mail address.`;
	const after = [
		'The link works once and expires in 24 hours.',
		'If you did not ask for it, ignore this message: nobody can sign in without the link.'
	];
	return {
		subject,
		text: [intro, '', 'Sign in:', url, '', ...after].join('\n'),
		html: htmlBody([intro], { href: url, label: 'Sign in to Furrowcast' }, after)
	};
}

/** An owner's invitation to join a farm with a role. */
export function invitationMail(input: {
	farmName: string;
	role: FarmRole;
	invitedBy: string;
	url: string;
	expiresAt: Date;
}): MailContent {
	const role = farmRoleLabels[input.role].toLowerCase();
	const what =
		input.role === 'reviewer'
			? 'As a reviewer you can read its plans and budgets, comment on them and sign them off; you cannot change them.'
			: 'As an editor you can change its fields, prices and plans; you cannot manage its members.';
	const intro = `${input.invitedBy} invites you to ${input.farmName} on Furrowcast as ${role === 'editor' ? 'an' : 'a'} ${role}.`;
	const expiry = `The invitation works once and expires on ${dateFormat.format(input.expiresAt)} UTC. Create an account or sign in with this e-mail address when the link asks you to.`;
	const after = ['If you did not expect this invitation, ignore this message.'];
	return {
		subject: `Invitation to ${input.farmName} on Furrowcast`,
		text: [intro, '', what, '', 'Accept the invitation:', input.url, '', expiry, '', ...after].join(
			'\n'
		),
		html: htmlBody([intro, what], { href: input.url, label: 'Accept the invitation' }, [
			expiry,
			...after
		])
	};
}
