import type { Handle, HandleServerError, ServerInit } from '@sveltejs/kit';
import { sequence } from '@sveltejs/kit/hooks';
import { building } from '$app/environment';
import { handle as authHandle } from '$lib/server/auth/auth';
import { db } from '$lib/server/db';
import { findSessionUser } from '$lib/server/db/users';
import { startJobWorkers } from '$lib/server/jobs/workers';

/** Every app server works the job queue (Monte Carlo runs); a build never starts it. */
export const init: ServerInit = async () => {
	if (!building) await startJobWorkers();
};

/** Puts the signed-in user (still existing, with current site role) on `locals` for every request. */
const loadUser: Handle = async ({ event, resolve }) => {
	const session = await event.locals.auth();
	const id = session?.user?.id;
	event.locals.user = id ? ((await findSessionUser(db, id)) ?? null) : null;
	return resolve(event);
};

export const handle = sequence(authHandle, loadUser);

export const handleError: HandleServerError = ({ error, event, status }) => {
	if (status !== 404) console.error(`${event.request.method} ${event.url.pathname}`, error);
	return { message: status === 404 ? 'Not found.' : 'Something went wrong on our side.' };
};
