import {
	currentFormatVersion,
	type PlanDocument,
	type PlanDocumentInput
} from '$lib/schemas/plan-file';
import { insertAuditEntry } from './audit';
import type { Db, Tx } from './client';
import { exportCropPractices, insertCropPractices } from './crop-practices';
import { exportCrops, insertCrops } from './crops';
import { farmSettingsOf } from './farms';
import { exportFieldOperations, insertFieldOperations } from './field-operations';
import { insertFields } from './fields';
import { insertHerd } from './herds';
import { exportPeople, insertPeople } from './people';
import { findPlanWithCurrentVersion, insertPlan } from './plans';
import { exportPriceSets, insertPriceSets } from './price-sets';
import { exportRotations, insertRotations } from './rotations';

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
	const saved = await insertPlan(tx, {
		farmId,
		userId,
		name: doc.plan.name,
		isReference,
		startYear: doc.plan.horizon.startYear,
		years: doc.plan.horizon.years,
		assumptions: doc.plan.assumptions,
		herd: doc.herd,
		notes: doc.notes,
		fieldRotations: doc.plan.fieldRotations.map((assignment) => ({
			fieldId: fieldIds.get(assignment.fieldId)!,
			rotationId: rotationIds.get(assignment.rotationId)!,
			startingPhase: assignment.startingPhase
		}))
	});
	await insertAuditEntry(tx, {
		farmId,
		userId,
		action: 'plan.imported',
		detail: { planId: saved.planId, name: doc.plan.name }
	});
	return saved;
}

/**
 * The plan file of a plan's current version: the farm with its people, operations, practices and rotations,
 * the fields the plan assigns, and the prices of the plan's years. Parse it with `parsePlanDocument`.
 */
export async function exportPlanDocument(db: Db | Tx, planId: string): Promise<PlanDocumentInput> {
	const plan = await findPlanWithCurrentVersion(db, planId);
	if (!plan) throw new Error(`No plan ${planId}`);
	const { farm, version } = plan;
	if (!version) throw new Error(`Plan ${planId} has no version ${plan.currentVersion}`);
	const assignments = [...version.assignments].sort((a, b) =>
		a.field.key.localeCompare(b.field.key)
	);
	const years = Array.from({ length: version.years }, (_, i) => version.startYear + i);
	const [crops, people, operations, practices, rotations, priceSets] = await Promise.all([
		exportCrops(db, farm.id),
		exportPeople(db, farm.id),
		exportFieldOperations(db, farm.id),
		exportCropPractices(db, farm.id),
		exportRotations(db, farm.id),
		exportPriceSets(db, farm.id, years)
	]);

	const { id: _farmId, ...settings } = farmSettingsOf(farm);
	return {
		formatVersion: currentFormatVersion,
		notes: version.notes,
		farm: settings,
		crops,
		fields: assignments.map(({ field }) => ({
			id: field.key,
			name: field.name,
			acres: field.acres,
			productivityIndex: field.productivityIndex,
			priorCrop: field.priorCrop,
			priorCropNitrogenCreditLbPerAcre: field.priorCropNitrogenCreditLbPerAcre,
			tenure: field.tenure,
			cashRentUsdPerAcre: field.cashRentUsdPerAcre,
			notes: field.notes
		})),
		people,
		herd: version.herd,
		operations,
		practices,
		rotations,
		priceSets,
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
