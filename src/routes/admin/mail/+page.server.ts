import { requireSiteAdmin } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import { listCapturedMail } from '$lib/server/db/mail';
import type { PageServerLoad } from './$types';

export const load = (async (event) => {
	requireSiteAdmin(event);
	const messages = await listCapturedMail(db, { limit: 100 });
	return {
		messages: messages.map(({ id, receivedAt, from, to, subject, text }) => ({
			id,
			receivedAt,
			from,
			to,
			subject,
			text
		}))
	};
}) satisfies PageServerLoad;
