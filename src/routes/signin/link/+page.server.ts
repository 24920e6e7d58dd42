import { fail, isRedirect, redirect } from '@sveltejs/kit';
import { z } from 'zod';
import { emailSchema } from '$lib/schemas/account';
import { toFieldErrors } from '$lib/schemas/issues';
import { signIn } from '$lib/server/auth/auth';
import { safeRedirect } from '$lib/server/auth/redirects';
import {
	countSignInLinkRequest,
	postgresSignInLinkRequests
} from '$lib/server/auth/sign-in-limiter';
import { pool } from '$lib/server/db';
import type { Actions, PageServerLoad } from './$types';

const linkRequests = postgresSignInLinkRequests(pool);
const linkSchema = z.object({ email: emailSchema });

// The form sits on the sign-in page too; this page shows it alone, and again with its message.
export const load = (({ locals, url }) => {
	const redirectTo = safeRedirect(url.searchParams.get('redirectTo'));
	if (locals.user) redirect(303, redirectTo);
	return { redirectTo };
}) satisfies PageServerLoad;

export const actions = {
	default: async (event) => {
		// Auth.js reads the body itself, so check the fields on a copy first.
		const form = await event.request.clone().formData();
		const redirectTo = safeRedirect(String(form.get('redirectTo') ?? ''));
		const parsed = linkSchema.safeParse(Object.fromEntries(form));
		if (!parsed.success) {
			return fail(400, {
				email: String(form.get('email') ?? ''),
				redirectTo,
				errors: toFieldErrors(parsed.error),
				failure: null
			});
		}
		const counted = await countSignInLinkRequest(linkRequests, parsed.data.email);
		if (counted !== 'ok') {
			return fail(counted === 'throttled' ? 429 : 503, {
				email: parsed.data.email,
				redirectTo,
				errors: {} as Record<string, string>,
				failure:
					counted === 'throttled'
						? 'Five sign-in links were sent to this address in the last hour. Use one of them, or wait an hour.'
						: 'Sign-in links cannot be sent right now. Try again in a few minutes.'
			});
		}
		// Auth.js mails the link, then redirects to its verify-request step, which only sends the
		// browser on to pages.verifyRequest: go there in one step.
		try {
			await signIn(event);
		} catch (err) {
			if (isRedirect(err) && new URL(err.location, event.url).pathname === '/auth/verify-request') {
				redirect(303, '/signin/check-email');
			}
			throw err;
		}
	}
} satisfies Actions;
