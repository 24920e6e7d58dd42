import { json } from '@sveltejs/kit';
import { capturedMailQuerySchema } from '$lib/schemas/invitations';
import { invalidInput } from '$lib/server/api';
import { requireSiteAdmin } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import { listCapturedMail } from '$lib/server/db/mail';
import type { RequestHandler } from './$types';

/** Mail the local sink caught (development and tests), newest first; site admins only. */
export const GET: RequestHandler = async (event) => {
	requireSiteAdmin(event);
	const parsed = capturedMailQuerySchema.safeParse({
		to: event.url.searchParams.get('to') ?? undefined,
		limit: event.url.searchParams.get('limit') ?? undefined
	});
	if (!parsed.success) return invalidInput(parsed.error);
	return json({ messages: await listCapturedMail(db, parsed.data) });
};
