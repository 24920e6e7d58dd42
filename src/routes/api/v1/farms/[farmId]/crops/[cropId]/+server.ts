import { error, json } from '@sveltejs/kit';
import { cropSchema } from '$lib/schemas/crops';
import { isJsonObject } from '$lib/schemas/farm-setup';
import { conflict, invalidInput, invalidValue, readJson } from '$lib/server/api';
import { requireFarmAccess } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import { deleteCrop, findCrop, updateCrop } from '$lib/server/db/crops';
import { builtInCropMessage, cropInUseMessage } from '$lib/server/farm-setup';
import type { RequestHandler } from './$types';

/** One crop by its plan-file id (`corn`, or one of the farm's own). */
export const GET: RequestHandler = async (event) => {
	const { farm } = await requireFarmAccess(event, event.params.farmId, 'farm:view');
	return json({ crop: await cropOr404(farm.id, event.params.cropId) });
};

/** Changes the values the body gives of one of the farm's own crops (owner or editor); the id stays. */
export const PATCH: RequestHandler = async (event) => {
	const { user, farm } = await requireFarmAccess(event, event.params.farmId, 'farm:edit');
	const stored = await cropOr404(farm.id, event.params.cropId);
	if (stored.builtIn) return conflict(builtInCropMessage(stored.name));
	const body = await readJson(event.request);
	if (!body.ok) return body.response;
	const { builtIn: _, ...values } = stored;
	if (isJsonObject(body.body) && body.body.id !== undefined && body.body.id !== stored.id) {
		return invalidValue('id', `A crop's id cannot change: add a new crop instead.`);
	}
	// Pounds per unit follow the sale unit when the body changes the unit alone to one that states its weight.
	const merged = isJsonObject(body.body) ? { ...values, ...body.body } : body.body;
	const parsed = cropSchema.safeParse(withImpliedWeight(merged, body.body));
	if (!parsed.success) return invalidInput(parsed.error);
	const crop = await updateCrop(db, farm.id, user.id, parsed.data);
	return json({ crop: { ...crop, builtIn: false } });
};

/** Deletes one of the farm's own crops (owner or editor); 409 naming the practices that grow it. */
export const DELETE: RequestHandler = async (event) => {
	const { user, farm } = await requireFarmAccess(event, event.params.farmId, 'farm:edit');
	const crop = await cropOr404(farm.id, event.params.cropId);
	if (crop.builtIn) return conflict(builtInCropMessage(crop.name));
	const result = await deleteCrop(db, farm.id, user.id, crop);
	if (!result.deleted) {
		return conflict(cropInUseMessage(crop.name, result.practiceNames), {
			practices: result.practiceNames
		});
	}
	return new Response(null, { status: 204 });
};

async function cropOr404(farmId: string, cropId: string) {
	const crop = await findCrop(db, farmId, cropId);
	if (!crop) error(404, 'Crop not found.');
	return crop;
}

/** The stored lbPerUnit is dropped when the body sets soldBy but not lbPerUnit (the schema fills it in). */
function withImpliedWeight(merged: unknown, body: unknown): unknown {
	if (!isJsonObject(merged) || !isJsonObject(body)) return merged;
	if (body.soldBy === undefined || body.lbPerUnit !== undefined) return merged;
	const { lbPerUnit: _, ...rest } = merged;
	return rest;
}
