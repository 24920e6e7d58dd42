import { CredentialsSignin } from '@auth/sveltekit';
import { fail, redirect } from '@sveltejs/kit';
import { signInSchema } from '$lib/schemas/account';
import { toFieldErrors } from '$lib/schemas/issues';
import { signIn } from '$lib/server/auth/auth';
import { safeRedirect } from '$lib/server/auth/redirects';
import type { Actions, PageServerLoad } from './$types';

const noMatch = { status: 400, message: 'That e-mail and password do not match an account.' };
// By the code of the refusal; the code also arrives in the URL, so a Map, not an object's keys.
const failures = new Map([
	['credentials', noMatch],
	[
		'throttled',
		{ status: 429, message: 'Too many failed attempts. Wait 15 minutes, then try again.' }
	],
	[
		'unavailable',
		{ status: 503, message: 'Sign-in is unavailable right now. Try again in a few minutes.' }
	]
]);
const failureOf = (code: string | null) => failures.get(code ?? '') ?? noMatch;

// Auth.js's own error names for the e-mailed link, as it puts them in the URL.
const linkFailures = new Map([
	['Verification', 'That sign-in link has expired or was already used. Ask for a new one below.'],
	['EmailSignin', 'The sign-in link could not be sent. Try again in a few minutes.']
]);

export const load = (({ locals, url }) => {
	const redirectTo = safeRedirect(url.searchParams.get('redirectTo'));
	if (locals.user) redirect(303, redirectTo);
	const error = url.searchParams.get('error');
	const failure = error
		? (linkFailures.get(error) ?? failureOf(url.searchParams.get('code')).message)
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
			const { status, message } = failureOf(err.code);
			return fail(status, {
				email: parsed.data.email,
				errors: {} as Record<string, string>,
				failure: message
			});
		}
	}
} satisfies Actions;
