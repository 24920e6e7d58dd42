import { error, json } from '@sveltejs/kit';
import { z } from 'zod';
import { conflict } from '$lib/server/api';
import { requireFarmAccess } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import { removeMember } from '$lib/server/db/members';
import { memberRefusals } from '$lib/server/members';
import type { RequestHandler } from './$types';

/** Takes someone off the farm (owners only); the farm's last owner stays. */
export const DELETE: RequestHandler = async (event) => {
	const { user, farm } = await requireFarmAccess(event, event.params.farmId, 'members:manage');
	const memberId = event.params.userId;
	if (!z.uuid().safeParse(memberId).success) error(404, memberRefusals.get('not-found')!);
	const result = await removeMember(db, farm.id, memberId, user.id);
	if (!result.ok) {
		if (result.refused === 'not-found') error(404, memberRefusals.get('not-found')!);
		return conflict(memberRefusals.get('last-owner')!);
	}
	return json({ removed: result.removed });
};
