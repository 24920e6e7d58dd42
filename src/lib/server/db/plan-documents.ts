import { and, eq, inArray } from 'drizzle-orm';
import type { PlanDocument } from '$lib/schemas/plan-file';
import type { Tx } from './client';
import {
	auditLog,
	cropPractices,
	fieldOperations,
	fields,
	herds,
	planFieldAssignments,
	plans,
	planVersions,
	practiceOperations,
	priceSetItems,
	priceSets,
	rotations,
	rotationSteps
} from './schema';

/** Row ids by the plan file's own ids, after an import. */
type KeyMap = Map<string, string>;

async function keyMap(
	tx: Tx,
	table: typeof fields | typeof fieldOperations | typeof cropPractices | typeof rotations,
	farmId: string,
	keys: string[]
): Promise<KeyMap> {
	const rows = await tx
		.select({ id: table.id, key: table.key })
		.from(table)
		.where(and(eq(table.farmId, farmId), inArray(table.key, keys)));
	return new Map(rows.map((row) => [row.key, row.id]));
}

/**
 * Saves a validated plan document into a farm: its fields, herd, prices, operations, practices and
 * rotations, then the plan as version 1. Parts the farm already has under the same id are kept as they
 * are, so several plan files of one farm share them. Runs inside the caller's transaction.
 */
export async function importPlanDocument(
	tx: Tx,
	{
		farmId,
		userId,
		doc,
		isReference
	}: { farmId: string; userId: string | null; doc: PlanDocument; isReference: boolean }
) {
	await tx
		.insert(fields)
		.values(doc.fields.map(({ id, ...field }) => ({ ...field, farmId, key: id })))
		.onConflictDoNothing();

	if (doc.herd) {
		await tx
			.insert(herds)
			.values({ ...doc.herd, farmId })
			.onConflictDoNothing();
	}

	for (const set of doc.priceSets) {
		const [row] = await tx
			.insert(priceSets)
			.values({
				farmId,
				year: set.year,
				nitrogenUsdPerLb: set.nitrogenUsdPerLb,
				dieselUsdPerGallon: set.dieselUsdPerGallon,
				labourUsdPerHour: set.labourUsdPerHour,
				hayUsdPerBale: set.hayUsdPerBale
			})
			.onConflictDoNothing()
			.returning({ id: priceSets.id });
		if (!row) continue;
		const items = [
			...Object.entries(set.cropPricesUsdPerUnit).map(([key, priceUsd]) => ({
				kind: 'crop' as const,
				key,
				priceUsd
			})),
			...Object.entries(set.seedPrices).flatMap(([key, price]) => [
				...(price.usdPerThousandSeeds === undefined
					? []
					: [
							{ kind: 'seed-per-thousand-seeds' as const, key, priceUsd: price.usdPerThousandSeeds }
						]),
				...(price.usdPerLb === undefined
					? []
					: [{ kind: 'seed-per-lb' as const, key, priceUsd: price.usdPerLb }])
			]),
			...Object.entries(set.customRatesUsdPerAcre).map(([key, priceUsd]) => ({
				kind: 'custom-rate-per-acre' as const,
				key,
				priceUsd
			}))
		];
		if (items.length) {
			await tx.insert(priceSetItems).values(items.map((item) => ({ ...item, priceSetId: row.id })));
		}
	}

	if (doc.operations.length) {
		await tx
			.insert(fieldOperations)
			.values(
				doc.operations.map((op) =>
					op.by === 'custom'
						? { farmId, key: op.id, name: op.name, by: op.by, month: op.month }
						: {
								farmId,
								key: op.id,
								name: op.name,
								by: op.by,
								month: op.month,
								speedMph: op.speedMph,
								widthFt: op.widthFt,
								fieldEfficiencyPercent: op.fieldEfficiencyPercent,
								fuelBasis: op.fuel.basis,
								dieselGallonsPerAcre:
									op.fuel.basis === 'per-acre' ? op.fuel.dieselGallonsPerAcre : null,
								tractorMaxPtoHp: op.fuel.basis === 'pto-power' ? op.fuel.tractorMaxPtoHp : null,
								dieselGallonsPerHpHour:
									op.fuel.basis === 'pto-power' ? op.fuel.dieselGallonsPerHpHour : null,
								labourFactor: op.labourFactor,
								repairsUsdPerAcre: op.repairsUsdPerAcre
							}
				)
			)
			.onConflictDoNothing();
	}
	const operationIds = await keyMap(
		tx,
		fieldOperations,
		farmId,
		doc.operations.map((op) => op.id)
	);

	const newPractices = await tx
		.insert(cropPractices)
		.values(
			doc.practices.map(
				({
					id,
					name,
					crop,
					yieldGoalPerAcre,
					otherFertiliserUsdPerAcre,
					chemicalsUsdPerAcre,
					otherDirectUsdPerAcre,
					operations: _,
					...detail
				}) => ({
					farmId,
					key: id,
					name,
					crop,
					yieldGoalPerAcre,
					otherFertiliserUsdPerAcre,
					chemicalsUsdPerAcre,
					otherDirectUsdPerAcre,
					detail
				})
			)
		)
		.onConflictDoNothing()
		.returning({ id: cropPractices.id, key: cropPractices.key });
	const steps = newPractices.flatMap(({ id, key }) =>
		doc.practices
			.find((p) => p.id === key)!
			.operations.map((step, i) => ({
				practiceId: id,
				sequence: i + 1,
				operationId: operationIds.get(step.operationId)!,
				month: step.month ?? null,
				passes: step.passes
			}))
	);
	if (steps.length) await tx.insert(practiceOperations).values(steps);
	const practiceIds = await keyMap(
		tx,
		cropPractices,
		farmId,
		doc.practices.map((p) => p.id)
	);

	const newRotations = await tx
		.insert(rotations)
		.values(doc.rotations.map(({ id, name }) => ({ farmId, key: id, name })))
		.onConflictDoNothing()
		.returning({ id: rotations.id, key: rotations.key });
	const rotationRows = newRotations.flatMap(({ id, key }) =>
		doc.rotations
			.find((r) => r.id === key)!
			.practices.map((practiceKey, i) => ({
				rotationId: id,
				position: i + 1,
				practiceId: practiceIds.get(practiceKey)!
			}))
	);
	if (rotationRows.length) await tx.insert(rotationSteps).values(rotationRows);
	const rotationIds = await keyMap(
		tx,
		rotations,
		farmId,
		doc.rotations.map((r) => r.id)
	);
	const fieldIds = await keyMap(
		tx,
		fields,
		farmId,
		doc.fields.map((f) => f.id)
	);

	const [plan] = await tx
		.insert(plans)
		.values({ farmId, name: doc.plan.name, isReference, createdById: userId })
		.returning({ id: plans.id });
	const [version] = await tx
		.insert(planVersions)
		.values({
			planId: plan.id,
			version: 1,
			startYear: doc.plan.horizon.startYear,
			years: doc.plan.horizon.years,
			assumptions: doc.plan.assumptions,
			notes: doc.notes,
			savedById: userId
		})
		.returning({ id: planVersions.id });
	await tx.insert(planFieldAssignments).values(
		doc.plan.fieldRotations.map((assignment) => ({
			planVersionId: version.id,
			fieldId: fieldIds.get(assignment.fieldId)!,
			rotationId: rotationIds.get(assignment.rotationId)!,
			startingPhase: assignment.startingPhase
		}))
	);
	await tx.insert(auditLog).values({
		farmId,
		userId,
		action: 'plan.imported',
		detail: { planId: plan.id, name: doc.plan.name }
	});
	return { planId: plan.id, planVersionId: version.id };
}
