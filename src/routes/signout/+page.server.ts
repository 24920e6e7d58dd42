import { redirect } from '@sveltejs/kit';
import { signOut } from '$lib/server/auth/auth';
import type { Actions, PageServerLoad } from './$types';

export const load = (() => redirect(303, '/')) satisfies PageServerLoad;

export const actions = { default: signOut } satisfies Actions;
