import { error, redirect } from '@sveltejs/kit';
import { farmRoleLabels } from '$lib/roles';
import { requireUser } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import { acceptInvitation, findInvitationByToken } from '$lib/server/db/invitations';
import {
	closedInvitationMessages,
	invitationPath,
	isInvitationTokenShaped,
	type InvitationStatus
} from '$lib/server/invitations';
import type { Actions, PageServerLoad } from './$types';

/** A link that does not work: 404 for one that never did, 410 for one that no longer does. */
function refuse(status: InvitationStatus | 'invalid'): never {
	error(status === 'invalid' ? 404 : 410, closedInvitationMessages.get(status)!);
}

// Public: the invitee may have no account yet. The page only reads; joining is the form below.
export const load = (async ({ params, locals }) => {
	const invitation = isInvitationTokenShaped(params.token)
		? await findInvitationByToken(db, params.token)
		: undefined;
	if (!invitation) refuse('invalid');
	if (invitation.status !== 'pending') refuse(invitation.status);
	const here = invitationPath(params.token);
	return {
		farmName: invitation.farmName,
		role: farmRoleLabels[invitation.role],
		email: invitation.email,
		invitedBy: invitation.invitedByName ?? invitation.invitedByEmail,
		expiresAt: invitation.expiresAt,
		signedInAs: locals.user?.email ?? null,
		emailMatches: locals.user?.email.toLowerCase() === invitation.email,
		registerHref: `/register?${new URLSearchParams({ redirectTo: here, email: invitation.email })}`,
		signInHref: `/signin?${new URLSearchParams({ redirectTo: here })}`
	};
}) satisfies PageServerLoad;

export const actions = {
	default: async (event) => {
		const user = requireUser(event);
		const { token } = event.params;
		const result = isInvitationTokenShaped(token)
			? await acceptInvitation(db, token, user)
			: ({ ok: false, refused: 'invalid' } as const);
		if (!result.ok) {
			if (result.refused === 'other-email') {
				error(
					403,
					'This invitation is for another e-mail address. Sign out, then sign in or create an account with the address it was sent to.'
				);
			}
			refuse(result.refused);
		}
		redirect(303, `/farms/${result.farmId}?joined=1`);
	}
} satisfies Actions;
