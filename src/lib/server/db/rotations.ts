import { and, asc, eq, ne } from 'drizzle-orm';
import { keyFromName } from '$lib/schemas/farm-setup';
import type { PlanDocument, PlanDocumentInput } from '$lib/schemas/plan-file';
import { insertAuditEntry } from './audit';
import type { Db, Tx } from './client';
import { findIdsByKey, type IdsByKey, isRowId } from './keys';
import { planFieldAssignments, plans, planVersions, rotations, rotationSteps } from './schema';

type RotationInput = PlanDocumentInput['rotations'][number];

/**
 * Adds the rotations the farm does not have yet (by plan-file id), each with its steps (practice row
 * ids by plan-file id in `practiceIds`), in one transaction; the row ids of all of them.
 */
export async function insertRotations(
	db: Db | Tx,
	farmId: string,
	input: PlanDocument['rotations'],
	practiceIds: IdsByKey
): Promise<IdsByKey> {
	return db.transaction(async (tx) => {
		const added = await tx
			.insert(rotations)
			.values(input.map(({ id, name }) => ({ farmId, key: id, name })))
			.onConflictDoNothing()
			.returning({ id: rotations.id, key: rotations.key });
		const byKey = new Map(input.map((rotation) => [rotation.id, rotation]));
		const steps = added.flatMap(({ id, key }) =>
			byKey.get(key)!.practices.map((practiceKey, i) => ({
				rotationId: id,
				position: i + 1,
				practiceId: practiceIds.get(practiceKey)!
			}))
		);
		if (steps.length) await tx.insert(rotationSteps).values(steps);
		return findIdsByKey(
			tx,
			rotations,
			farmId,
			input.map((rotation) => rotation.id)
		);
	});
}

/** The farm's rotations by name, each with its practices' names in order. */
export async function listRotationsByFarm(db: Db | Tx, farmId: string) {
	const rows = await db.query.rotations.findMany({
		columns: { id: true, name: true },
		where: eq(rotations.farmId, farmId),
		orderBy: [asc(rotations.name), asc(rotations.key)],
		with: {
			steps: {
				columns: { position: true },
				orderBy: asc(rotationSteps.position),
				with: { practice: { columns: { name: true } } }
			}
		}
	});
	return rows.map(({ id, name, steps }) => ({
		id,
		name,
		steps: steps.map((step) => step.practice.name)
	}));
}

/** The farm's rotations as the plan file states them, practices by their plan-file ids. */
export async function exportRotations(db: Db | Tx, farmId: string): Promise<RotationInput[]> {
	const rows = await db.query.rotations.findMany({
		where: eq(rotations.farmId, farmId),
		orderBy: asc(rotations.key),
		with: {
			steps: {
				orderBy: asc(rotationSteps.position),
				with: { practice: { columns: { key: true } } }
			}
		}
	});
	return rows.map((rotation) => ({
		id: rotation.key,
		name: rotation.name,
		practices: rotation.steps.map((step) => step.practice.key)
	}));
}

/** A rotation as the API gives it: row id, plan-file key, and its practices by key and row id. */
export interface RotationRow {
	id: string;
	key: string;
	name: string;
	practices: { key: string; id: string }[];
}

const rotationWith = {
	columns: { id: true, key: true, name: true },
	with: {
		steps: {
			columns: { position: true },
			orderBy: asc(rotationSteps.position),
			with: { practice: { columns: { id: true, key: true } } }
		}
	}
} as const;

function rotationOf(row: {
	id: string;
	key: string;
	name: string;
	steps: { practice: { id: string; key: string } }[];
}): RotationRow {
	return {
		id: row.id,
		key: row.key,
		name: row.name,
		practices: row.steps.map(({ practice }) => ({ key: practice.key, id: practice.id }))
	};
}

/** The farm's rotations by name, each with its practices year by year. */
export async function listRotations(db: Db | Tx, farmId: string): Promise<RotationRow[]> {
	const rows = await db.query.rotations.findMany({
		...rotationWith,
		where: eq(rotations.farmId, farmId),
		orderBy: [asc(rotations.name), asc(rotations.key)]
	});
	return rows.map(rotationOf);
}

/** One of the farm's rotations; undefined for another farm's rotation or an id that is not a UUID. */
export async function findRotationById(
	db: Db | Tx,
	farmId: string,
	rotationId: string
): Promise<RotationRow | undefined> {
	if (!isRowId(rotationId)) return undefined;
	const row = await db.query.rotations.findFirst({
		...rotationWith,
		where: and(eq(rotations.farmId, farmId), eq(rotations.id, rotationId))
	});
	return row && rotationOf(row);
}

/**
 * The plan-file id a rotation saves under: `wanted` when no other rotation of the farm has it (undefined
 * when one does), else one made from the name. `rotationId` is the rotation being changed.
 */
export async function chooseRotationKey(
	db: Db | Tx,
	farmId: string,
	{ name, wanted, rotationId }: { name: string; wanted?: string; rotationId?: string }
): Promise<string | undefined> {
	const rows = await db
		.select({ key: rotations.key })
		.from(rotations)
		.where(
			and(eq(rotations.farmId, farmId), rotationId ? ne(rotations.id, rotationId) : undefined)
		);
	const taken = new Set(rows.map((row) => row.key));
	if (wanted !== undefined) return taken.has(wanted) ? undefined : wanted;
	return keyFromName(name, taken, 'rotation');
}

/** A rotation ready to save: its key chosen, its practices' row ids year by year. */
export interface RotationToSave {
	key: string;
	name: string;
	practiceIds: string[];
}

async function insertRotationSteps(tx: Tx, rotationId: string, practiceIds: string[]) {
	await tx
		.insert(rotationSteps)
		.values(practiceIds.map((practiceId, i) => ({ rotationId, position: i + 1, practiceId })));
}

/** Adds one rotation with its years and its audit entry, in one transaction. */
export async function insertRotation(
	db: Db | Tx,
	farmId: string,
	userId: string,
	rotation: RotationToSave
): Promise<RotationRow> {
	return db.transaction(async (tx) => {
		const [row] = await tx
			.insert(rotations)
			.values({ farmId, key: rotation.key, name: rotation.name })
			.returning({ id: rotations.id });
		await insertRotationSteps(tx, row.id, rotation.practiceIds);
		await insertAuditEntry(tx, {
			farmId,
			userId,
			action: 'rotation.created',
			detail: { rotationId: row.id, name: rotation.name }
		});
		return (await findRotationById(tx, farmId, row.id))!;
	});
}

/** Replaces a rotation's name, key and years and records who did it, in one transaction. */
export async function updateRotation(
	db: Db | Tx,
	farmId: string,
	userId: string,
	rotationId: string,
	rotation: RotationToSave
): Promise<RotationRow> {
	return db.transaction(async (tx) => {
		await tx
			.update(rotations)
			.set({ key: rotation.key, name: rotation.name })
			.where(and(eq(rotations.farmId, farmId), eq(rotations.id, rotationId)));
		await tx.delete(rotationSteps).where(eq(rotationSteps.rotationId, rotationId));
		await insertRotationSteps(tx, rotationId, rotation.practiceIds);
		await insertAuditEntry(tx, {
			farmId,
			userId,
			action: 'rotation.updated',
			detail: { rotationId, name: rotation.name }
		});
		return (await findRotationById(tx, farmId, rotationId))!;
	});
}

/** The names of the farm's plans with a version that assigns the rotation to a field. */
export async function listPlansUsingRotation(db: Db | Tx, rotationId: string): Promise<string[]> {
	const rows = await db
		.selectDistinct({ name: plans.name })
		.from(planFieldAssignments)
		.innerJoin(planVersions, eq(planVersions.id, planFieldAssignments.planVersionId))
		.innerJoin(plans, eq(plans.id, planVersions.planId))
		.where(eq(planFieldAssignments.rotationId, rotationId))
		.orderBy(asc(plans.name));
	return rows.map((row) => row.name);
}

/**
 * Deletes a rotation no plan version uses, with its audit entry, in one transaction that locks the
 * rotation first; the plans that use it (nothing deleted) when there are any.
 */
export async function deleteRotation(
	db: Db | Tx,
	farmId: string,
	userId: string,
	rotation: Pick<RotationRow, 'id' | 'name'>
): Promise<{ deleted: true } | { deleted: false; planNames: string[] }> {
	return db.transaction(async (tx) => {
		const where = and(eq(rotations.farmId, farmId), eq(rotations.id, rotation.id));
		await tx.select({ id: rotations.id }).from(rotations).where(where).for('update');
		const planNames = await listPlansUsingRotation(tx, rotation.id);
		if (planNames.length) return { deleted: false, planNames };
		await tx.delete(rotations).where(where);
		await insertAuditEntry(tx, {
			farmId,
			userId,
			action: 'rotation.deleted',
			detail: { rotationId: rotation.id, name: rotation.name }
		});
		return { deleted: true };
	});
}
