import { error, redirect, type RequestEvent } from '@sveltejs/kit';
import { z } from 'zod';
import type { FarmRole } from '$lib/roles';
import { db } from '$lib/server/db';
import { findMembership } from '$lib/server/db/farms';
import { findPlan } from '$lib/server/db/plans';
import { findJob } from '$lib/server/jobs/queue';

/** The one table that says what each farm role may do. */
export const farmPermissions = {
	owner: ['farm:view', 'farm:edit', 'plan:edit', 'plan:delete', 'members:manage', 'farm:audit'],
	editor: ['farm:view', 'farm:edit', 'plan:edit'],
	reviewer: ['farm:view', 'plan:review']
} as const satisfies Record<FarmRole, readonly string[]>;

export type FarmAction = (typeof farmPermissions)[FarmRole][number];

export interface SessionUser {
	id: string;
	email: string;
	name: string | null;
	isSiteAdmin: boolean;
}

export function roleAllows(role: FarmRole, action: FarmAction): boolean {
	return (farmPermissions[role] as readonly FarmAction[]).includes(action);
}

const isApi = (event: Pick<RequestEvent, 'url'>) => event.url.pathname.startsWith('/api/');

/** The signed-in user; APIs answer 401, pages send the visitor to sign in and back. */
export function requireUser(event: Pick<RequestEvent, 'locals' | 'url'>): SessionUser {
	const user = event.locals.user;
	if (user) return user;
	if (isApi(event)) error(401, 'Sign in to use this API.');
	redirect(303, `/signin?redirectTo=${encodeURIComponent(event.url.pathname + event.url.search)}`);
}

export function requireSiteAdmin(event: Pick<RequestEvent, 'locals' | 'url'>): SessionUser {
	const user = requireUser(event);
	if (!user.isSiteAdmin) error(403, 'Only a site administrator may do this.');
	return user;
}

const farmIdSchema = z.uuid();

/**
 * The user's membership of a farm, when the role allows the action.
 * Not a member (or no such farm): 404, so nobody learns that a farm exists. A member without the right: 403.
 */
export async function requireFarmAccess(
	event: Pick<RequestEvent, 'locals' | 'url'>,
	farmId: string,
	action: FarmAction
) {
	const user = requireUser(event);
	const membership = farmIdSchema.safeParse(farmId).success
		? await findMembership(db, farmId, user.id)
		: undefined;
	if (!membership) error(404, 'Farm not found.');
	if (!roleAllows(membership.role, action)) {
		error(403, `A ${membership.role} of this farm may not do this.`);
	}
	return { user, farm: membership.farm, role: membership.role };
}

/** `requireFarmAccess`, then one of the farm's plans: 404 `Plan not found.` for any other id. */
export async function requirePlanAccess(
	event: Pick<RequestEvent, 'locals' | 'url'>,
	farmId: string,
	planId: string,
	action: FarmAction
) {
	const access = await requireFarmAccess(event, farmId, action);
	const plan = await findPlan(db, access.farm.id, planId);
	if (!plan) error(404, 'Plan not found.');
	return { ...access, plan };
}

/**
 * A queued job (a Monte Carlo run), for a member of the job's farm who may view it. Any other id, a job
 * of a farm the user is not a member of, or no job at all: 404 `Job not found.` alike.
 */
export async function requireJobAccess(event: Pick<RequestEvent, 'locals' | 'url'>, jobId: string) {
	const user = requireUser(event);
	const job = await findJob(jobId);
	const membership = job && (await findMembership(db, job.owner.farmId, user.id));
	if (!job || !membership || !roleAllows(membership.role, 'farm:view')) {
		error(404, 'Job not found.');
	}
	return { user, job, farm: membership.farm, role: membership.role };
}
