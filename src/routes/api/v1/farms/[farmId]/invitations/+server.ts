import { json } from '@sveltejs/kit';
import { invitationSchema } from '$lib/schemas/invitations';
import { conflict, invalidInput, readJson } from '$lib/server/api';
import { requireFarmAccess } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import { listInvitations } from '$lib/server/db/invitations';
import { invitationRefusals, inviteByEmail } from '$lib/server/members';
import type { RequestHandler } from './$types';

/** The farm's invitations, newest first, each with its status (owners only). */
export const GET: RequestHandler = async (event) => {
	const { farm } = await requireFarmAccess(event, event.params.farmId, 'members:manage');
	return json({ invitations: await listInvitations(db, farm.id) });
};

/** Invites someone by e-mail as an editor or reviewer: saved and e-mailed together (owners only). */
export const POST: RequestHandler = async (event) => {
	const { user, farm } = await requireFarmAccess(event, event.params.farmId, 'members:manage');
	const body = await readJson(event.request);
	if (!body.ok) return body.response;
	const parsed = invitationSchema.safeParse(body.body);
	if (!parsed.success) return invalidInput(parsed.error);
	const result = await inviteByEmail({
		farm,
		inviter: user,
		invitation: parsed.data,
		origin: event.url.origin
	});
	if (!result.ok) {
		const message = invitationRefusals.get(result.refused)!;
		if (result.refused === 'mail') {
			return json({ message, issues: [{ path: '(document)', message }] }, { status: 502 });
		}
		return conflict(message);
	}
	return json({ invitation: result.invitation }, { status: 201 });
};
