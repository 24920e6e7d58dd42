import { error } from '@sveltejs/kit';
import { evaluatePlan, summarisePlan } from '$lib/engine';
import { resultsQuerySchema } from '$lib/schemas/plans';
import { requirePlanAccess } from '$lib/server/auth/access';
import { displayUnits, shownScales } from '$lib/server/display-units';
import { db } from '$lib/server/db';
import { findReferencePlan, listPlanVersions } from '$lib/server/db/plans';
import { listReviewEntries, notShared, statesByVersion } from '$lib/server/db/reviews';
import { evaluateStoredPlan } from '$lib/server/plan-report';
import type { PageServerLoad } from './$types';

// The printable report of one plan version: everything a lender files with a credit decision.
export const load = (async (event) => {
	const { farm, plan } = await requirePlanAccess(
		event,
		event.params.farmId,
		event.params.planId,
		'farm:view'
	);
	const asked = resultsQuerySchema
		.pick({ version: true })
		.safeParse({ version: event.url.searchParams.get('version') ?? undefined });
	if (!asked.success) error(404, 'No such version of this plan.');
	const version = asked.data.version ?? plan.currentVersion;
	const referencePlan = await findReferencePlan(db, farm.id);
	const [evaluation, versions, entries] = await Promise.all([
		evaluateStoredPlan(db, farm, plan, version, referencePlan ?? null),
		listPlanVersions(db, plan.id),
		listReviewEntries(db, plan.id)
	]);
	const saved = versions.find((v) => v.version === version);
	if (!saved) error(404, `This plan has no version ${version}.`);
	const states = statesByVersion(entries);
	const base = {
		farm: { id: farm.id, name: farm.name, region: farm.region, unitSystem: farm.unitSystem },
		plan: {
			id: plan.id,
			name: plan.name,
			isReference: plan.isReference,
			currentVersion: plan.currentVersion
		},
		version: { ...saved, review: states.get(version) ?? notShared },
		referencePlanName: referencePlan && referencePlan.id !== plan.id ? referencePlan.name : null,
		review: {
			states: versions.map((v) => ({
				version: v.version,
				...(states.get(v.version) ?? notShared)
			})),
			entries: entries.toReversed()
		},
		scales: shownScales(farm.unitSystem),
		printedAt: new Date()
	};
	if (!evaluation.ok) return { ...base, report: null, problem: evaluation.message };
	const { document, summary, reference } = evaluation;
	const show = displayUnits(farm.unitSystem);
	const practiceNames = new Map(document.practices.map((p) => [p.id, p.name]));
	const rotationNames = new Map(document.rotations.map((r) => [r.id, r.name]));
	return {
		...base,
		problem: null,
		report: {
			summary,
			referenceSummary: reference && summarisePlan(evaluatePlan(reference.document)),
			grid: summary.fields.map((field) => ({
				key: field.fieldId,
				name: field.fieldName,
				area: show.amount(field.acres, 'area')!,
				rotation: rotationNames.get(field.rotationId) ?? field.rotationId,
				practices: field.practiceIdByYear.map((id) => practiceNames.get(id) ?? id)
			})),
			herdHead: document.herd?.head ?? null,
			assumptions: document.plan.assumptions,
			notes: document.notes ?? ''
		}
	};
}) satisfies PageServerLoad;
