import { fail, redirect } from '@sveltejs/kit';
import { registerSchema } from '$lib/schemas/account';
import { toFieldErrors } from '$lib/schemas/issues';
import { signIn } from '$lib/server/auth/auth';
import { safeRedirect } from '$lib/server/auth/redirects';
import { hashPassword } from '$lib/server/auth/password';
import { db } from '$lib/server/db';
import { createUser } from '$lib/server/db/users';
import type { Actions, PageServerLoad } from './$types';

// `redirectTo` brings the new account back where it came from (an invitation); `email` fills the form.
export const load = (({ locals, url }) => {
	const redirectTo = safeRedirect(url.searchParams.get('redirectTo'));
	if (locals.user) redirect(303, redirectTo);
	return { redirectTo, email: url.searchParams.get('email')?.slice(0, 320) ?? '' };
}) satisfies PageServerLoad;

export const actions = {
	default: async (event) => {
		// Auth.js reads the body itself when it signs the new account in, so read a copy here.
		const form = await event.request.clone().formData();
		const values = {
			name: String(form.get('name') ?? ''),
			email: String(form.get('email') ?? ''),
			redirectTo: safeRedirect(String(form.get('redirectTo') ?? ''))
		};
		const parsed = registerSchema.safeParse(Object.fromEntries(form));
		if (!parsed.success) return fail(400, { values, errors: toFieldErrors(parsed.error) });

		const { name, email, password } = parsed.data;
		const user = await createUser(db, { name, email, passwordHash: await hashPassword(password) });
		if (!user) {
			return fail(400, {
				values,
				errors: { email: 'An account with this e-mail already exists.' } as Record<string, string>
			});
		}
		await signIn(event);
	}
} satisfies Actions;
