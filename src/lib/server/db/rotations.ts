import { asc, eq } from 'drizzle-orm';
import type { PlanDocument, PlanDocumentInput } from '$lib/schemas/plan-file';
import type { Db, Tx } from './client';
import { findIdsByKey, type IdsByKey } from './keys';
import { rotations, rotationSteps } from './schema';

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
		orderBy: asc(rotations.name),
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
