import { asc, eq } from 'drizzle-orm';
import { builtInCrops, type CropDefinition } from '$lib/schemas/crops';
import type { Db, Tx } from './client';
import { crops } from './schema';

/** Adds the crops the farm does not have yet (by plan-file id): the built-ins and the file's own. */
export async function insertCrops(db: Db | Tx, farmId: string, input: CropDefinition[]) {
	if (!input.length) return;
	await db
		.insert(crops)
		.values(input.map(({ id, ...crop }) => ({ ...crop, farmId, key: id })))
		.onConflictDoNothing();
}

/** The farm's crops as `CropDefinition`s, for showing yields and prices in the crop's own unit. */
export async function listCropsByFarm(db: Db | Tx, farmId: string): Promise<CropDefinition[]> {
	const rows = await db.query.crops.findMany({
		columns: {
			key: true,
			name: true,
			soldBy: true,
			lbPerUnit: true,
			residueLeafHuskLbDmPerUnit: true,
			legume: true
		},
		where: eq(crops.farmId, farmId),
		orderBy: asc(crops.key)
	});
	return rows.map(({ key, ...crop }) => ({ id: key, ...crop }));
}

const builtInById = new Map(builtInCrops.map((crop) => [crop.id, crop]));
const sameAsBuiltIn = (crop: CropDefinition) => {
	const builtIn = builtInById.get(crop.id);
	return (
		builtIn !== undefined &&
		(Object.keys(builtIn) as (keyof CropDefinition)[]).every((k) => builtIn[k] === crop[k])
	);
};

/** The crops a plan file must list: the farm's own and any built-in it states otherwise. */
export async function exportCrops(db: Db | Tx, farmId: string): Promise<CropDefinition[]> {
	return (await listCropsByFarm(db, farmId)).filter((crop) => !sameAsBuiltIn(crop));
}
