import { error, redirect } from '@sveltejs/kit';
import { fail, setError, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { z } from 'zod';
import { invitationSchema } from '$lib/schemas/invitations';
import { requireFarmAccess } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import { listInvitations, revokeInvitation } from '$lib/server/db/invitations';
import { listFarmMembers, removeMember } from '$lib/server/db/members';
import { INVITATION_DAYS } from '$lib/server/invitations';
import {
	closedInvitationRefusal,
	invitationRefusals,
	inviteByEmail,
	memberRefusals
} from '$lib/server/members';
import type { Actions, PageServerLoad } from './$types';

const inviteAdapter = zod4(invitationSchema);
const idSchema = z.uuid();

export const load = (async (event) => {
	const { user, farm } = await requireFarmAccess(event, event.params.farmId, 'members:manage');
	const [members, invitations, form] = await Promise.all([
		listFarmMembers(db, farm.id),
		listInvitations(db, farm.id),
		superValidate({ role: 'reviewer' as const }, inviteAdapter, { errors: false })
	]);
	return {
		farm: { id: farm.id, name: farm.name },
		userId: user.id,
		members: members.map(({ userId, name, email, role, since }) => ({
			userId,
			name,
			email,
			role,
			since
		})),
		// Waiting and run-out invitations: used and withdrawn ones are in the audit log.
		invitations: invitations
			.filter((i) => i.status === 'pending' || i.status === 'expired')
			.map(({ id, email, role, status, invitedBy, createdAt, expiresAt }) => ({
				id,
				email,
				role,
				status,
				invitedBy: invitedBy?.name ?? invitedBy?.email ?? null,
				createdAt,
				expiresAt
			})),
		invitationDays: INVITATION_DAYS,
		form
	};
}) satisfies PageServerLoad;

export const actions = {
	invite: async (event) => {
		const { user, farm } = await requireFarmAccess(event, event.params.farmId, 'members:manage');
		const form = await superValidate(event.request, inviteAdapter);
		if (!form.valid) return fail(400, { form });
		const result = await inviteByEmail({
			farm,
			inviter: user,
			invitation: form.data,
			origin: event.url.origin
		});
		if (!result.ok) {
			return setError(form, 'email', invitationRefusals.get(result.refused)!, {
				status: result.refused === 'mail' ? 502 : 400
			});
		}
		redirect(
			303,
			`/farms/${farm.id}/members?invited=${encodeURIComponent(result.invitation.email)}`
		);
	},
	revokeInvitation: async (event) => {
		const { user, farm } = await requireFarmAccess(event, event.params.farmId, 'members:manage');
		const id = String((await event.request.formData()).get('invitationId') ?? '');
		if (!idSchema.safeParse(id).success) error(404, 'Invitation not found.');
		const result = await revokeInvitation(db, farm.id, id, user.id);
		if (!result.ok) {
			if (result.refused === 'not-found') error(404, 'Invitation not found.');
			return fail(400, { failure: closedInvitationRefusal });
		}
		redirect(
			303,
			`/farms/${farm.id}/members?revoked=${encodeURIComponent(result.invitation.email)}`
		);
	},
	removeMember: async (event) => {
		const { user, farm } = await requireFarmAccess(event, event.params.farmId, 'members:manage');
		const memberId = String((await event.request.formData()).get('userId') ?? '');
		if (!idSchema.safeParse(memberId).success) error(404, memberRefusals.get('not-found')!);
		const result = await removeMember(db, farm.id, memberId, user.id);
		if (!result.ok) {
			if (result.refused === 'not-found') error(404, memberRefusals.get('not-found')!);
			return fail(400, { failure: memberRefusals.get('last-owner')! });
		}
		// An owner who left the farm can no longer see this page.
		if (memberId === user.id) redirect(303, '/farms');
		redirect(303, `/farms/${farm.id}/members?removed=${encodeURIComponent(result.removed.email)}`);
	}
} satisfies Actions;
