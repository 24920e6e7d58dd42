import { redirect } from '@sveltejs/kit';
import type { PageServerLoad } from './$types';

export const load = (({ locals }) => {
	if (locals.user) redirect(303, '/farms');
}) satisfies PageServerLoad;
