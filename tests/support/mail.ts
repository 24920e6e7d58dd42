// Reading the mail the local sink caught, as a site admin does (GET /api/v1/admin/mail).
import { signedIn, type Client } from './http';
import { demoUsers } from './server';

export interface CapturedMail {
	id: string;
	receivedAt: string;
	from: string;
	to: string[];
	subject: string;
	text: string;
	html: string | null;
}

let admin: Promise<Client> | undefined;

/** The newest messages to `to` (the sink has stored a message before the app's send returns). */
export async function mailTo(to: string): Promise<CapturedMail[]> {
	admin ??= signedIn(demoUsers.admin);
	const response = await (
		await admin
	).fetch(`/api/v1/admin/mail?to=${encodeURIComponent(to)}&limit=20`);
	if (response.status !== 200) throw new Error(`reading mail failed with ${response.status}`);
	return ((await response.json()) as { messages: CapturedMail[] }).messages;
}

/** The one link in the newest message to `to` whose path starts with `pathPrefix`, as a path. */
export async function linkInMail(to: string, pathPrefix: string): Promise<string> {
	const [newest] = await mailTo(to);
	if (!newest) throw new Error(`no mail to ${to}`);
	const links = [...newest.text.matchAll(/https?:\/\/\S+/g)].map((m) => new URL(m[0]));
	const link = links.find((url) => url.pathname.startsWith(pathPrefix));
	if (!link) throw new Error(`no ${pathPrefix} link in the mail to ${to}: ${newest.text}`);
	return link.pathname + link.search;
}
