import { error } from '@sveltejs/kit';
import { requirePlanAccess, roleAllows } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import { listFields } from '$lib/server/db/fields';
import { findFamilyHoursByMonth } from '$lib/server/db/people';
import { listRotations } from '$lib/server/db/rotations';
import { loadRotationChoices, rotationYear } from '$lib/server/practices';
import { findDraft } from '$lib/server/plans';
import type { PageServerLoad } from './$types';

// Lenders may solve and look (as the results API lets them); the optimiser itself runs from the API.
export const load = (async (event) => {
	const { farm, role, plan } = await requirePlanAccess(
		event,
		event.params.farmId,
		event.params.planId,
		'farm:view'
	);
	const canEdit = roleAllows(role, 'plan:edit');
	const [draft, fields, rotations, { practices, cropById }, familyHours] = await Promise.all([
		findDraft(db, plan),
		listFields(db, farm.id),
		listRotations(db, farm.id),
		loadRotationChoices(db, farm.id),
		findFamilyHoursByMonth(db, farm.id)
	]);
	if (!draft) error(404, 'This plan has no saved version.');
	const practiceById = new Map(practices.map((practice) => [practice.id, practice]));
	const shownRotations = rotations.map((rotation) => ({
		key: rotation.key,
		name: rotation.name,
		years: rotation.practices.map(({ id }) => rotationYear(practiceById.get(id)!, cropById))
	}));
	// The crops the rotations grow: the ones a share limit can name.
	const crops = [
		...new Map(shownRotations.flatMap((r) => r.years.map((y) => [y.cropId, y.cropName] as const)))
	].map(([id, name]) => ({ id, name }));
	return {
		farm: { id: farm.id, name: farm.name },
		plan: {
			id: plan.id,
			name: plan.name,
			startYear: draft.plan.horizon.startYear,
			years: draft.plan.horizon.years
		},
		canEdit,
		// Only someone who may save a mix as a plan needs the draft it starts from.
		draft: canEdit ? draft : null,
		familyHoursByMonth: familyHours ?? farm.labourHoursAvailableByMonth,
		fields: fields.map((field) => ({ key: field.key, name: field.name, acres: field.acres })),
		rotations: shownRotations,
		crops
	};
}) satisfies PageServerLoad;
