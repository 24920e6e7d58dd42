import { and, asc, eq, inArray } from 'drizzle-orm';
import type { PlanDocument, PlanDocumentInput } from '$lib/schemas/plan-file';
import type { Db, Tx } from './client';
import { farmSettingsOf } from './farm-settings';
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
			herd: doc.herd,
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

type OperationInput = PlanDocumentInput['operations'] extends (infer T)[] | undefined ? T : never;
type PriceSetInput = PlanDocumentInput['priceSets'][number];

/**
 * The plan file of a plan's current version: the farm with its operations, practices and rotations,
 * the fields the plan assigns, and the prices of the plan's years. Parse it with `parsePlanDocument`.
 */
export async function exportPlanDocument(db: Db | Tx, planId: string): Promise<PlanDocumentInput> {
	const plan = await db.query.plans.findFirst({
		where: eq(plans.id, planId),
		with: {
			farm: true,
			versions: { with: { assignments: { with: { field: true, rotation: true } } } }
		}
	});
	if (!plan) throw new Error(`No plan ${planId}`);
	const version = plan.versions.find((v) => v.version === plan.currentVersion);
	if (!version) throw new Error(`Plan ${planId} has no version ${plan.currentVersion}`);
	const { farm } = plan;
	const assignments = [...version.assignments].sort((a, b) =>
		a.field.key.localeCompare(b.field.key)
	);
	const years = Array.from({ length: version.years }, (_, i) => version.startYear + i);
	const [operationRows, practiceRows, rotationRows, priceRows] = await Promise.all([
		db.query.fieldOperations.findMany({
			where: eq(fieldOperations.farmId, farm.id),
			orderBy: asc(fieldOperations.key)
		}),
		db.query.cropPractices.findMany({
			where: eq(cropPractices.farmId, farm.id),
			orderBy: asc(cropPractices.key),
			with: { operations: { with: { operation: { columns: { key: true } } } } }
		}),
		db.query.rotations.findMany({
			where: eq(rotations.farmId, farm.id),
			orderBy: asc(rotations.key),
			with: { steps: { with: { practice: { columns: { key: true } } } } }
		}),
		db.query.priceSets.findMany({
			where: and(eq(priceSets.farmId, farm.id), inArray(priceSets.year, years)),
			orderBy: asc(priceSets.year),
			with: { items: true }
		})
	]);

	const { id: _farmId, ...settings } = farmSettingsOf(farm);
	return {
		formatVersion: 1,
		notes: version.notes,
		farm: settings,
		fields: assignments.map(({ field }) => ({
			id: field.key,
			name: field.name,
			acres: field.acres,
			productivityIndex: field.productivityIndex,
			priorCrop: field.priorCrop,
			priorCropNitrogenCreditLbPerAcre: field.priorCropNitrogenCreditLbPerAcre,
			notes: field.notes
		})),
		herd: version.herd,
		operations: operationRows.map(operationOf),
		practices: practiceRows.map((practice) => ({
			...(practice.detail as object),
			id: practice.key,
			name: practice.name,
			crop: practice.crop,
			yieldGoalPerAcre: practice.yieldGoalPerAcre,
			otherFertiliserUsdPerAcre: practice.otherFertiliserUsdPerAcre,
			chemicalsUsdPerAcre: practice.chemicalsUsdPerAcre,
			otherDirectUsdPerAcre: practice.otherDirectUsdPerAcre,
			operations: [...practice.operations]
				.sort((a, b) => a.sequence - b.sequence)
				.map((s) => ({
					operationId: s.operation.key,
					...(s.month === null ? {} : { month: s.month }),
					passes: s.passes
				}))
		})),
		rotations: rotationRows.map((rotation) => ({
			id: rotation.key,
			name: rotation.name,
			practices: [...rotation.steps]
				.sort((a, b) => a.position - b.position)
				.map((s) => s.practice.key)
		})),
		priceSets: priceRows.map(priceSetOf),
		plan: {
			name: plan.name,
			horizon: { startYear: version.startYear, years: version.years },
			fieldRotations: assignments.map((a) => ({
				fieldId: a.field.key,
				rotationId: a.rotation.key,
				startingPhase: a.startingPhase
			})),
			assumptions: version.assumptions
		}
	};
}

function operationOf(op: typeof fieldOperations.$inferSelect): OperationInput {
	if (op.by === 'custom') return { id: op.key, name: op.name, by: 'custom', month: op.month };
	const fuel =
		op.fuelBasis === 'pto-power'
			? {
					basis: 'pto-power' as const,
					tractorMaxPtoHp: op.tractorMaxPtoHp!,
					dieselGallonsPerHpHour: op.dieselGallonsPerHpHour!
				}
			: { basis: 'per-acre' as const, dieselGallonsPerAcre: op.dieselGallonsPerAcre! };
	return {
		id: op.key,
		name: op.name,
		by: 'own',
		month: op.month,
		speedMph: op.speedMph!,
		widthFt: op.widthFt!,
		fieldEfficiencyPercent: op.fieldEfficiencyPercent!,
		fuel,
		labourFactor: op.labourFactor!,
		repairsUsdPerAcre: op.repairsUsdPerAcre!
	};
}

function priceSetOf(
	set: typeof priceSets.$inferSelect & { items: (typeof priceSetItems.$inferSelect)[] }
): PriceSetInput {
	const of = (kind: (typeof priceSetItems.$inferSelect)['kind']) =>
		set.items.filter((item) => item.kind === kind);
	const seedPrices: Record<string, { usdPerThousandSeeds?: number; usdPerLb?: number }> = {};
	for (const item of of('seed-per-thousand-seeds')) {
		seedPrices[item.key] = { ...seedPrices[item.key], usdPerThousandSeeds: item.priceUsd };
	}
	for (const item of of('seed-per-lb')) {
		seedPrices[item.key] = { ...seedPrices[item.key], usdPerLb: item.priceUsd };
	}
	return {
		year: set.year,
		cropPricesUsdPerUnit: Object.fromEntries(of('crop').map((i) => [i.key, i.priceUsd])),
		nitrogenUsdPerLb: set.nitrogenUsdPerLb,
		dieselUsdPerGallon: set.dieselUsdPerGallon,
		labourUsdPerHour: set.labourUsdPerHour,
		hayUsdPerBale: set.hayUsdPerBale,
		seedPrices,
		customRatesUsdPerAcre: Object.fromEntries(
			of('custom-rate-per-acre').map((i) => [i.key, i.priceUsd])
		)
	};
}
