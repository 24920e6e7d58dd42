import { error, json } from '@sveltejs/kit';
import { z } from 'zod';
import { conflict } from '$lib/server/api';
import { requireFarmAccess } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import { revokeInvitation } from '$lib/server/db/invitations';
import { closedInvitationRefusal } from '$lib/server/members';
import type { RequestHandler } from './$types';

/** Withdraws an invitation that has not been used: its link refuses from then on (owners only). */
export const DELETE: RequestHandler = async (event) => {
	const { user, farm } = await requireFarmAccess(event, event.params.farmId, 'members:manage');
	const id = event.params.invitationId;
	if (!z.uuid().safeParse(id).success) error(404, 'Invitation not found.');
	const result = await revokeInvitation(db, farm.id, id, user.id);
	if (!result.ok) {
		if (result.refused === 'not-found') error(404, 'Invitation not found.');
		return conflict(closedInvitationRefusal);
	}
	return json({ invitation: result.invitation });
};
