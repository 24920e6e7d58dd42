import { json } from '@sveltejs/kit';
import { operationDefaults } from '$lib/operation-defaults';
import { requireUser } from '$lib/server/auth/access';
import type { RequestHandler } from './$types';

/** The catalogue of default operations, each with its `source`: `{ operationDefaults: [...] }`. */
export const GET: RequestHandler = async (event) => {
	requireUser(event);
	return json({ operationDefaults });
};
