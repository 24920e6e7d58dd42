import { error, redirect } from '@sveltejs/kit';
import { fail, setError, superValidate } from 'sveltekit-superforms';
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
import { listReviewEntries, notShared, statesByVersion } from '$lib/server/db/reviews';
import { reviewAdapter, shareAdapter } from '$lib/server/review-forms';
import { reviewPlan, sharePlan } from '$lib/server/reviews';
import type { Actions, PageServerLoad } from './$types';

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
	const canReview = roleAllows(role, 'plan:review');
	const canShare = roleAllows(role, 'plan:edit');
	const [
		draft,
		versions,
		fields,
		rotations,
		{ practices, cropById },
		priceSets,
		plans,
		farmHerd,
		reviewEntries,
		reviewForm,
		shareForm
	] = await Promise.all([
		findDraft(db, plan, openedVersion),
		listPlanVersions(db, plan.id),
		listFields(db, farm.id),
		listRotations(db, farm.id),
		loadRotationChoices(db, farm.id),
		listPriceSets(db, farm.id),
		listPlansByFarm(db, farm.id),
		findHerd(db, farm.id),
		listReviewEntries(db, plan.id),
		canReview ? superValidate({ version: openedVersion }, reviewAdapter, { errors: false }) : null,
		canShare ? superValidate({ version: openedVersion }, shareAdapter, { errors: false }) : null
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
		versions,
		review: { ...reviewOf(reviewEntries, versions, openedVersion), reviewForm, shareForm }
	};
}) satisfies PageServerLoad;

export const actions = {
	/** An owner or editor shares the newest version for review; the reviewers get an e-mail. */
	share: async (event) => {
		const { user, farm, plan } = await requirePlanAccess(
			event,
			event.params.farmId,
			event.params.planId,
			'plan:edit'
		);
		const form = await superValidate(event.request, shareAdapter);
		if (!form.valid) return fail(400, { shareForm: form });
		const outcome = await sharePlan(farm, plan, user, form.data, event.url.origin);
		if (!outcome.ok) {
			return setError(form, 'version', outcome.message, { status: 400 });
		}
		redirect(303, `${planPath(farm.id, plan.id)}?version=${outcome.version}&shared=1#review`);
	},
	/** A reviewer comments on a version, approves it or asks for changes; owners and editors get an e-mail. */
	review: async (event) => {
		const { user, farm, plan } = await requirePlanAccess(
			event,
			event.params.farmId,
			event.params.planId,
			'plan:review'
		);
		// "Comment only" posts an empty decision: no decision.
		const formData = await event.request.formData();
		if (formData.get('decision') === '') formData.delete('decision');
		const form = await superValidate(formData, reviewAdapter);
		if (!form.valid) return fail(400, { reviewForm: form });
		const outcome = await reviewPlan(farm, plan, user, form.data, event.url.origin);
		if (!outcome.ok) {
			return setError(form, outcome.path as 'comment', outcome.message, { status: 400 });
		}
		redirect(
			303,
			`${planPath(farm.id, plan.id)}?version=${outcome.version}&reviewed=${form.data.decision ?? 'comment'}#review`
		);
	}
} satisfies Actions;

const planPath = (farmId: string, planId: string) => `/farms/${farmId}/plans/${planId}`;

/** What the review panel shows: each version's state, the opened one's, and the history by version. */
function reviewOf(
	entries: Awaited<ReturnType<typeof listReviewEntries>>,
	versions: { version: number }[],
	openedVersion: number
) {
	const states = statesByVersion(entries);
	return {
		opened: states.get(openedVersion) ?? notShared,
		states: versions.map(({ version }) => ({ version, ...(states.get(version) ?? notShared) })),
		entries: entries.toReversed()
	};
}
