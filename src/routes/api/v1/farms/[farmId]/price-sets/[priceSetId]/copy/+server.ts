import { error, json } from '@sveltejs/kit';
import { requireFarmAccess } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import { findPriceSetById } from '$lib/server/db/price-sets';
import { copyToNextYear, refusalResponse } from '$lib/server/prices';
import type { RequestHandler } from './$types';

/** Copies the set to the next year (owner or editor): 201 `{ priceSet }`; 409 when that year has one. */
export const POST: RequestHandler = async (event) => {
	const { user, farm } = await requireFarmAccess(event, event.params.farmId, 'farm:edit');
	const set = await findPriceSetById(db, farm.id, event.params.priceSetId);
	if (!set) error(404, 'Price set not found.');
	const copied = await copyToNextYear(db, farm.id, user.id, set);
	if (!copied.ok) return refusalResponse(copied);
	return json({ priceSet: copied.priceSet }, { status: 201 });
};
