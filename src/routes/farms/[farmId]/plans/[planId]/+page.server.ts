import { error } from '@sveltejs/kit';
import { resultsQuerySchema } from '$lib/schemas/plans';
import { requirePlanAccess, roleAllows } from '$lib/server/auth/access';
import { displayUnits, shownScales } from '$lib/server/display-units';
import { db } from '$lib/server/db';
import { listFields } from '$lib/server/db/fields';
import { findHerd } from '$lib/server/db/herds';
import { listPlansByFarm, listPlanVersions } from '$lib/server/db/plans';
import { listPriceSets } from '$lib/server/db/price-sets';
import { listRotations } from '$lib/server/db/rotations';
import { loadRotationChoices, rotationYear } from '$lib/server/practices';
import { findDraft } from '$lib/server/plans';
import type { PageServerLoad } from './$types';

// The editor works on the draft in the browser; results come from the plans API as it is edited.
export const load = (async (event) => {
	const { farm, role, plan } = await requirePlanAccess(
		event,
		event.params.farmId,
		event.params.planId,
		'farm:view'
	);
	const asked = resultsQuerySchema
		.pick({ version: true })
		.safeParse({ version: event.url.searchParams.get('version') ?? undefined });
	if (!asked.success) error(404, 'No such version of this plan.');
	const openedVersion = asked.data.version ?? plan.currentVersion;
	const [draft, versions, fields, rotations, { practices, cropById }, priceSets, plans, farmHerd] =
		await Promise.all([
			findDraft(db, plan, openedVersion),
			listPlanVersions(db, plan.id),
			listFields(db, farm.id),
			listRotations(db, farm.id),
			loadRotationChoices(db, farm.id),
			listPriceSets(db, farm.id),
			listPlansByFarm(db, farm.id),
			findHerd(db, farm.id)
		]);
	if (!draft) error(404, `This plan has no version ${openedVersion}.`);
	const practiceById = new Map(practices.map((practice) => [practice.id, practice]));
	const show = displayUnits(farm.unitSystem);
	const reference = plans.find((p) => p.isReference);
	return {
		farm: { id: farm.id, name: farm.name, unitSystem: farm.unitSystem },
		scales: shownScales(farm.unitSystem),
		canEdit: roleAllows(role, 'plan:edit'),
		plan: {
			id: plan.id,
			name: plan.name,
			isReference: plan.isReference,
			currentVersion: plan.currentVersion
		},
		openedVersion,
		draft,
		fields: fields.map((field) => ({
			key: field.key,
			name: field.name,
			area: show.amount(field.acres, 'area')!
		})),
		rotations: rotations.map((rotation) => ({
			key: rotation.key,
			name: rotation.name,
			years: rotation.practices.map(({ id }) => rotationYear(practiceById.get(id)!, cropById))
		})),
		priceSets: priceSets.map((set) => ({ id: set.id, year: set.year })),
		farmHerd,
		reference: reference && {
			id: reference.id,
			name: reference.name,
			startYear: reference.startYear,
			years: reference.years
		},
		otherPlans: plans.filter((p) => p.id !== plan.id).map((p) => ({ id: p.id, name: p.name })),
		versions
	};
}) satisfies PageServerLoad;
