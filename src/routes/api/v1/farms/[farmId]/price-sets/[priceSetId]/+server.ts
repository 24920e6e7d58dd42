import { error, json } from '@sveltejs/kit';
import { isJsonObject } from '$lib/schemas/farm-setup';
import { priceSetBodySchema } from '$lib/schemas/price-sets';
import { conflict, invalidInput, readJson } from '$lib/server/api';
import { requireFarmAccess } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import { deletePriceSet, findPriceSetById, updatePriceSet } from '$lib/server/db/price-sets';
import {
	findPriceableIds,
	invalidIssues,
	priceSetInUseMessage,
	unknownIdIssues,
	yearTaken,
	yearTakenMessage
} from '$lib/server/prices';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = async (event) => {
	const { farm } = await requireFarmAccess(event, event.params.farmId, 'farm:view');
	return json({ priceSet: await priceSetOr404(farm.id, event.params.priceSetId) });
};

/**
 * Changes the values the body gives (owner or editor): the stored set with the body over it must be a
 * valid set. A map the body gives (`cropPricesUsdPerUnit`…) replaces the stored one whole.
 */
export const PATCH: RequestHandler = async (event) => {
	const { user, farm } = await requireFarmAccess(event, event.params.farmId, 'farm:edit');
	const stored = await priceSetOr404(farm.id, event.params.priceSetId);
	const body = await readJson(event.request);
	if (!body.ok) return body.response;
	const { id, ...values } = stored;
	const input = isJsonObject(body.body) ? { ...values, ...body.body } : body.body;
	const parsed = priceSetBodySchema.safeParse(input);
	if (!parsed.success) return invalidInput(parsed.error);
	const unknown = unknownIdIssues(parsed.data, await findPriceableIds(db, farm.id));
	if (unknown.length) return invalidIssues(unknown);
	const saved = await updatePriceSet(db, farm.id, user.id, id, parsed.data);
	if (!saved.ok) return yearTaken(yearTakenMessage(parsed.data.year));
	return json({ priceSet: saved.priceSet });
};

/** Deletes a set (owner or editor); 409 naming the plans when a saved plan version needs its year. */
export const DELETE: RequestHandler = async (event) => {
	const { user, farm } = await requireFarmAccess(event, event.params.farmId, 'farm:edit');
	const set = await priceSetOr404(farm.id, event.params.priceSetId);
	const result = await deletePriceSet(db, farm.id, user.id, set);
	if (!result.deleted) {
		return conflict(priceSetInUseMessage(set.year, result.planNames), {
			plans: result.planNames
		});
	}
	return new Response(null, { status: 204 });
};

async function priceSetOr404(farmId: string, priceSetId: string) {
	const set = await findPriceSetById(db, farmId, priceSetId);
	if (!set) error(404, 'Price set not found.');
	return set;
}
