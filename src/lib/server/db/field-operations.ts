import { asc, eq } from 'drizzle-orm';
import type { PlanDocument, PlanDocumentInput } from '$lib/schemas/plan-file';
import type { Db, Tx } from './client';
import { findIdsByKey, type IdsByKey } from './keys';
import { fieldOperations } from './schema';

type FieldOperationInput = NonNullable<PlanDocumentInput['operations']>[number];

/** Adds the operations the farm does not have yet (by plan-file id); the row ids of all of them. */
export async function insertFieldOperations(
	db: Db | Tx,
	farmId: string,
	operations: PlanDocument['operations']
): Promise<IdsByKey> {
	if (operations.length) {
		await db
			.insert(fieldOperations)
			.values(operations.map((op) => rowOf(farmId, op)))
			.onConflictDoNothing();
	}
	return findIdsByKey(
		db,
		fieldOperations,
		farmId,
		operations.map((op) => op.id)
	);
}

/** The farm's operations by month, with what the farm data page lists. */
export async function listFieldOperationsByFarm(db: Db | Tx, farmId: string) {
	return db.query.fieldOperations.findMany({
		columns: {
			id: true,
			name: true,
			by: true,
			month: true,
			speedMph: true,
			widthFt: true,
			fieldEfficiencyPercent: true,
			repairsUsdPerAcre: true
		},
		where: eq(fieldOperations.farmId, farmId),
		orderBy: [asc(fieldOperations.month), asc(fieldOperations.name)]
	});
}

/** The farm's operations as the plan file states them. */
export async function exportFieldOperations(
	db: Db | Tx,
	farmId: string
): Promise<FieldOperationInput[]> {
	const rows = await db.query.fieldOperations.findMany({
		where: eq(fieldOperations.farmId, farmId),
		orderBy: asc(fieldOperations.key)
	});
	return rows.map(operationOf);
}

function rowOf(
	farmId: string,
	op: PlanDocument['operations'][number]
): typeof fieldOperations.$inferInsert {
	const common = { farmId, key: op.id, name: op.name, by: op.by, month: op.month };
	if (op.by === 'custom') return common;
	if (op.statedAs === 'per-acre') {
		return {
			...common,
			statedAs: op.statedAs,
			dieselGallonsPerAcre: op.dieselGallonsPerAcre,
			machineHoursPerAcre: op.machineHoursPerAcre,
			labourHoursPerAcre: op.labourHoursPerAcre,
			repairsUsdPerAcre: op.repairsUsdPerAcre
		};
	}
	return {
		...common,
		statedAs: op.statedAs,
		speedMph: op.speedMph,
		widthFt: op.widthFt,
		fieldEfficiencyPercent: op.fieldEfficiencyPercent,
		fuelBasis: op.fuel.basis,
		dieselGallonsPerAcre: op.fuel.basis === 'per-acre' ? op.fuel.dieselGallonsPerAcre : null,
		tractorMaxPtoHp: op.fuel.basis === 'pto-power' ? op.fuel.tractorMaxPtoHp : null,
		dieselGallonsPerHpHour: op.fuel.basis === 'pto-power' ? op.fuel.dieselGallonsPerHpHour : null,
		labourFactor: op.labourFactor,
		repairsUsdPerAcre: op.repairsUsdPerAcre
	};
}

function operationOf(op: typeof fieldOperations.$inferSelect): FieldOperationInput {
	const common = { id: op.key, name: op.name, month: op.month };
	if (op.by === 'custom') return { ...common, by: 'custom' };
	if (op.statedAs === 'per-acre') {
		return {
			...common,
			by: 'own',
			statedAs: 'per-acre',
			dieselGallonsPerAcre: op.dieselGallonsPerAcre!,
			machineHoursPerAcre: op.machineHoursPerAcre!,
			labourHoursPerAcre: op.labourHoursPerAcre!,
			repairsUsdPerAcre: op.repairsUsdPerAcre!
		};
	}
	const fuel =
		op.fuelBasis === 'pto-power'
			? {
					basis: 'pto-power' as const,
					tractorMaxPtoHp: op.tractorMaxPtoHp!,
					dieselGallonsPerHpHour: op.dieselGallonsPerHpHour!
				}
			: { basis: 'per-acre' as const, dieselGallonsPerAcre: op.dieselGallonsPerAcre! };
	return {
		...common,
		by: 'own',
		statedAs: 'machine',
		speedMph: op.speedMph!,
		widthFt: op.widthFt!,
		fieldEfficiencyPercent: op.fieldEfficiencyPercent!,
		fuel,
		labourFactor: op.labourFactor!,
		repairsUsdPerAcre: op.repairsUsdPerAcre!
	};
}
