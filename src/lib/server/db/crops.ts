import { and, asc, eq } from 'drizzle-orm';
import { builtInCrops, type CropDefinition } from '$lib/schemas/crops';
import { keyFromName } from '$lib/schemas/farm-setup';
import { insertAuditEntry } from './audit';
import type { Db, Tx } from './client';
import { cropPractices, crops } from './schema';

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

/** A crop as the crops page and API list it: built in (read-only) or the farm's own. */
export type ListedCrop = CropDefinition & { builtIn: boolean };

/**
 * Every crop the farm can grow: the built-ins (always there, whether or not the farm has rows for them;
 * a row a plan file stated under a built-in id shows its own numbers) and then the farm's own by name.
 */
export async function listCropsWithBuiltIns(db: Db | Tx, farmId: string): Promise<ListedCrop[]> {
	const rows = new Map((await listCropsByFarm(db, farmId)).map((crop) => [crop.id, crop]));
	const builtIns = builtInCrops.map((crop) => ({ ...(rows.get(crop.id) ?? crop), builtIn: true }));
	const own = [...rows.values()]
		.filter((crop) => !builtInById.has(crop.id))
		.sort((a, b) => a.name.localeCompare(b.name))
		.map((crop) => ({ ...crop, builtIn: false }));
	return [...builtIns, ...own];
}

/** One crop by plan-file id: a built-in or the farm's own; undefined when the farm has no such crop. */
export async function findCrop(
	db: Db | Tx,
	farmId: string,
	cropId: string
): Promise<ListedCrop | undefined> {
	const [row] = await db
		.select(cropReturning)
		.from(crops)
		.where(and(eq(crops.farmId, farmId), eq(crops.key, cropId)));
	const builtIn = builtInById.has(cropId);
	if (row) return { ...cropOf(row), builtIn };
	const crop = builtInById.get(cropId);
	return crop && { ...crop, builtIn: true };
}

export function isBuiltInCrop(cropId: string): boolean {
	return builtInById.has(cropId);
}

/**
 * The id a new crop of the farm's own saves under: `wanted` when neither a built-in nor one of the farm's
 * crops has it (undefined when one does), else one made from the name.
 */
export async function chooseCropId(
	db: Db | Tx,
	farmId: string,
	{ name, wanted }: { name: string; wanted?: string }
): Promise<string | undefined> {
	const rows = await db.select({ key: crops.key }).from(crops).where(eq(crops.farmId, farmId));
	const taken = new Set([...builtInById.keys(), ...rows.map((row) => row.key)]);
	if (wanted !== undefined) return taken.has(wanted) ? undefined : wanted;
	return keyFromName(name, taken, 'crop');
}

/** Adds one of the farm's own crops (its id already checked free) and its audit entry, together. */
export async function insertCrop(
	db: Db | Tx,
	farmId: string,
	userId: string,
	crop: CropDefinition
): Promise<CropDefinition> {
	return db.transaction(async (tx) => {
		const { id, ...values } = crop;
		const [row] = await tx
			.insert(crops)
			.values({ ...values, key: id, farmId })
			.returning(cropReturning);
		await insertAuditEntry(tx, {
			farmId,
			userId,
			action: 'crop.created',
			detail: { crop: id, name: crop.name }
		});
		return cropOf(row);
	});
}

/** Replaces one of the farm's own crops (the id stays) and records who did it, together. */
export async function updateCrop(
	db: Db | Tx,
	farmId: string,
	userId: string,
	crop: CropDefinition
): Promise<CropDefinition> {
	return db.transaction(async (tx) => {
		const { id, ...values } = crop;
		const [row] = await tx
			.update(crops)
			.set(values)
			.where(and(eq(crops.farmId, farmId), eq(crops.key, id)))
			.returning(cropReturning);
		await insertAuditEntry(tx, {
			farmId,
			userId,
			action: 'crop.updated',
			detail: { crop: id, name: crop.name }
		});
		return cropOf(row);
	});
}

/** The names of the farm's practices that grow the crop. */
export async function listPracticesUsingCrop(
	db: Db | Tx,
	farmId: string,
	cropId: string
): Promise<string[]> {
	const rows = await db
		.select({ name: cropPractices.name })
		.from(cropPractices)
		.where(and(eq(cropPractices.farmId, farmId), eq(cropPractices.crop, cropId)))
		.orderBy(asc(cropPractices.name));
	return rows.map((row) => row.name);
}

/**
 * Deletes one of the farm's own crops that no practice grows, with its audit entry, in one transaction
 * that locks the crop first; the practices that grow it (nothing deleted) when there are any.
 */
export async function deleteCrop(
	db: Db | Tx,
	farmId: string,
	userId: string,
	crop: Pick<CropDefinition, 'id' | 'name'>
): Promise<{ deleted: true } | { deleted: false; practiceNames: string[] }> {
	return db.transaction(async (tx) => {
		const where = and(eq(crops.farmId, farmId), eq(crops.key, crop.id));
		await tx.select({ id: crops.id }).from(crops).where(where).for('update');
		const practiceNames = await listPracticesUsingCrop(tx, farmId, crop.id);
		if (practiceNames.length) return { deleted: false, practiceNames };
		await tx.delete(crops).where(where);
		await insertAuditEntry(tx, {
			farmId,
			userId,
			action: 'crop.deleted',
			detail: { crop: crop.id, name: crop.name }
		});
		return { deleted: true };
	});
}

const cropReturning = {
	key: crops.key,
	name: crops.name,
	soldBy: crops.soldBy,
	lbPerUnit: crops.lbPerUnit,
	residueLeafHuskLbDmPerUnit: crops.residueLeafHuskLbDmPerUnit,
	legume: crops.legume
};

function cropOf({ key, ...crop }: { key: string } & Omit<CropDefinition, 'id'>): CropDefinition {
	return { id: key, ...crop };
}
