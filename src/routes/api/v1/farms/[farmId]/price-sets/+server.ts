import { json } from '@sveltejs/kit';
import { priceSetBodySchema } from '$lib/schemas/price-sets';
import { invalidInput, readJson } from '$lib/server/api';
import { requireFarmAccess } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import { createPriceSets, listPriceSets } from '$lib/server/db/price-sets';
import {
	findPriceableIds,
	invalidIssues,
	unknownIdIssues,
	yearTaken,
	yearTakenMessage
} from '$lib/server/prices';
import type { RequestHandler } from './$types';

/** The farm's price sets by year: `{ priceSets: [{ id, year, cropPricesUsdPerUnit, … }] }`. */
export const GET: RequestHandler = async (event) => {
	const { farm } = await requireFarmAccess(event, event.params.farmId, 'farm:view');
	return json({ priceSets: await listPriceSets(db, farm.id) });
};

/** Adds a year's prices (owner or editor): 201 `{ priceSet }`; 409 on `year` when the year has a set. */
export const POST: RequestHandler = async (event) => {
	const { user, farm } = await requireFarmAccess(event, event.params.farmId, 'farm:edit');
	const body = await readJson(event.request);
	if (!body.ok) return body.response;
	const parsed = priceSetBodySchema.safeParse(body.body);
	if (!parsed.success) return invalidInput(parsed.error);
	const unknown = unknownIdIssues(parsed.data, await findPriceableIds(db, farm.id));
	if (unknown.length) return invalidIssues(unknown);
	const saved = await createPriceSets(db, farm.id, user.id, [parsed.data]);
	if (!saved.ok) return yearTaken(yearTakenMessage(parsed.data.year));
	return json({ priceSet: saved.priceSets[0] }, { status: 201 });
};
