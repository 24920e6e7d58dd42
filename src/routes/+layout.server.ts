import type { LayoutServerLoad } from './$types';

// What the header shows: the signed-in address and, for an administrator, the accounts link.
export const load = (({ locals }) => ({
	user: locals.user && { email: locals.user.email, isSiteAdmin: locals.user.isSiteAdmin }
})) satisfies LayoutServerLoad;
