import type { LayoutServerLoad } from './$types';

export const load = (({ locals }) => ({
	user: locals.user && {
		name: locals.user.name,
		email: locals.user.email,
		isSiteAdmin: locals.user.isSiteAdmin
	}
})) satisfies LayoutServerLoad;
