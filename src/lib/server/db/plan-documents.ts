import { eq } from 'drizzle-orm';
import type { PlanDraft } from '$lib/schemas/plans';
import {
	currentFormatVersion,
	type PlanDocument,
	type PlanDocumentInput
} from '$lib/schemas/plan-file';
import { readAll, type Db, type Tx } from './client';
import { exportCropPractices, insertCropPractices } from './crop-practices';
import { exportCrops, insertCrops } from './crops';
import { farmSettingsOf } from './farms';
import { exportFieldOperations, insertFieldOperations } from './field-operations';
import { insertFields, listFields } from './fields';
import { insertHerd } from './herds';
import { exportPeople, insertPeople } from './people';
import { createPlan, findPlanVersion, storedAdjustments } from './plans';
import { exportPriceSets, insertPriceSets } from './price-sets';
import { exportRotations, insertRotations } from './rotations';
import { plans, type farms } from './schema';

/**
 * Saves a validated plan document into a farm: its crops, fields, people, herd, prices, operations,
 * practices and rotations, then the plan as version 1. Parts the farm already has under the same id are
 * kept as they are, so several plan files of one farm share them; with people, the farm's labour hours
 * become its family people's summed. Runs inside the caller's transaction.
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
	await insertCrops(tx, farmId, doc.crops);
	const fieldIds = await insertFields(tx, farmId, doc.fields);
	await insertPeople(tx, farmId, doc.people);
	if (doc.herd) await insertHerd(tx, farmId, doc.herd);
	await insertPriceSets(tx, farmId, doc.priceSets);
	const operationIds = await insertFieldOperations(tx, farmId, doc.operations);
	const practiceIds = await insertCropPractices(tx, farmId, doc.practices, operationIds);
	const rotationIds = await insertRotations(tx, farmId, doc.rotations, practiceIds);
	return createPlan(tx, {
		farmId,
		userId,
		name: doc.plan.name,
		isReference,
		action: 'plan.imported',
		changeNote: '',
		content: {
			startYear: doc.plan.horizon.startYear,
			years: doc.plan.horizon.years,
			assumptions: doc.plan.assumptions,
			adjustments: storedAdjustments(doc.plan.adjustments, fieldIds, practiceIds),
			herd: doc.herd,
			notes: doc.notes,
			fieldRotations: doc.plan.fieldRotations.map((assignment) => ({
				fieldId: fieldIds.get(assignment.fieldId)!,
				rotationId: rotationIds.get(assignment.rotationId)!,
				startingPhase: assignment.startingPhase
			}))
		}
	});
}

/**
 * The plan file of a draft on a farm: the farm with its crops, people, operations, practices and
 * rotations, the fields the draft assigns (a key the farm does not have is left out, so parsing names it)
 * and the prices of the draft's years. Parse it with `parsePlanDocument`.
 */
export async function draftPlanDocument(
	db: Db | Tx,
	farm: typeof farms.$inferSelect,
	draft: PlanDraft
): Promise<PlanDocumentInput> {
	const { startYear, years } = draft.plan.horizon;
	const planYears = Array.from({ length: years }, (_, i) => startYear + i);
	const [crops, fieldRows, people, operations, practices, rotations, priceSets] = await readAll(
		db,
		[
			() => exportCrops(db, farm.id),
			() => listFields(db, farm.id),
			() => exportPeople(db, farm.id),
			() => exportFieldOperations(db, farm.id),
			() => exportCropPractices(db, farm.id),
			() => exportRotations(db, farm.id),
			() => exportPriceSets(db, farm.id, planYears)
		]
	);
	const fieldByKey = new Map(fieldRows.map((field) => [field.key, field]));
	const { id: _farmId, ...settings } = farmSettingsOf(farm);
	return {
		formatVersion: currentFormatVersion,
		notes: draft.notes,
		farm: settings,
		crops,
		// Each field once, even when the draft gives it twice: parsing names the second assignment.
		fields: [...new Set(draft.plan.fieldRotations.map((a) => a.fieldId))].flatMap((fieldId) => {
			const field = fieldByKey.get(fieldId);
			if (!field) return [];
			return [
				{
					id: field.key,
					name: field.name,
					acres: field.acres,
					productivityIndex: field.productivityIndex,
					priorCrop: field.priorCrop,
					priorCropNitrogenCreditLbPerAcre: field.priorCropNitrogenCreditLbPerAcre,
					tenure: field.tenure,
					cashRentUsdPerAcre: field.cashRentUsdPerAcre,
					notes: field.notes
				}
			];
		}),
		people,
		herd: draft.herd,
		operations,
		practices,
		rotations,
		priceSets,
		plan: draft.plan
	};
}

/** A stored version as the draft the editor and the plans API work with. */
export function draftOfVersion(
	name: string,
	version: NonNullable<Awaited<ReturnType<typeof findPlanVersion>>>
): PlanDraft {
	return {
		plan: {
			name,
			horizon: { startYear: version.startYear, years: version.years },
			fieldRotations: version.fieldRotations,
			assumptions: version.assumptions,
			adjustments: version.adjustments
		},
		herd: version.herd ?? null,
		notes: version.notes
	};
}

/**
 * The plan file of a plan's version (the current one unless `version` is given): see
 * `draftPlanDocument`. Parse it with `parsePlanDocument`.
 */
export async function exportPlanDocument(
	db: Db | Tx,
	planId: string,
	version?: number
): Promise<PlanDocumentInput> {
	const plan = await db.query.plans.findFirst({
		where: eq(plans.id, planId),
		with: { farm: true }
	});
	if (!plan) throw new Error(`No plan ${planId}`);
	const stored = await findPlanVersion(db, planId, version ?? plan.currentVersion);
	if (!stored) throw new Error(`Plan ${planId} has no version ${version ?? plan.currentVersion}`);
	return draftPlanDocument(db, plan.farm, draftOfVersion(plan.name, stored));
}
