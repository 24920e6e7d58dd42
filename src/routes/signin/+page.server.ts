import { CredentialsSignin } from '@auth/sveltekit';
import { fail, redirect } from '@sveltejs/kit';
import { signInSchema } from '$lib/schemas/account';
import { toFieldErrors } from '$lib/schemas/issues';
import { signIn } from '$lib/server/auth/auth';
import type { Actions, PageServerLoad } from './$types';

const failureMessages: Record<string, string> = {
	throttled: 'Too many failed attempts. Wait 15 minutes, then try again.',
	credentials: 'That e-mail and password do not match an account.'
};

export const load = (({ locals, url }) => {
	const redirectTo = safeRedirect(url.searchParams.get('redirectTo'));
	if (locals.user) redirect(303, redirectTo);
	const failure = url.searchParams.get('error')
		? (failureMessages[url.searchParams.get('code') ?? ''] ?? failureMessages.credentials)
		: null;
	return { redirectTo, failure };
}) satisfies PageServerLoad;

export const actions = {
	default: async (event) => {
		// Auth.js reads the body itself, so check the fields on a copy first.
		const form = await event.request.clone().formData();
		const parsed = signInSchema.safeParse(Object.fromEntries(form));
		if (!parsed.success) {
			return fail(400, {
				email: String(form.get('email') ?? ''),
				errors: toFieldErrors(parsed.error),
				failure: null
			});
		}
		try {
			await signIn(event);
		} catch (err) {
			// Auth.js throws a refused sign-in; its redirect on success passes through.
			if (!(err instanceof CredentialsSignin)) throw err;
			const failure = failureMessages[err.code] ?? failureMessages.credentials;
			return fail(err.code === 'throttled' ? 429 : 400, {
				email: parsed.data.email,
				errors: {} as Record<string, string>,
				failure
			});
		}
	}
} satisfies Actions;

/** Only paths on this site, so a crafted link cannot send someone elsewhere after sign-in. */
function safeRedirect(target: string | null): string {
	return target && target.startsWith('/') && !target.startsWith('//') ? target : '/farms';
}
