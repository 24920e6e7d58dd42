import { error, fail, redirect } from '@sveltejs/kit';
import { parsePlanDocument } from '$lib/schemas/plan-file';
import { planCopySchema } from '$lib/schemas/plans';
import { toFieldIssues } from '$lib/schemas/issues';
import { requireFarmAccess, roleAllows } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import {
	copyPlan,
	deletePlan,
	findPlan,
	listPlansByFarm,
	makeReferencePlan
} from '$lib/server/db/plans';
import { checkVersion, importCheckedPlan, referencePlanDeleteMessage } from '$lib/server/plans';
import type { Actions, PageServerLoad } from './$types';

// A plan file is a few hundred kB at most (2,000 fields); the server's body limit is 2 MB.
const maxPlanFileBytes = 2_000_000;

export const load = (async (event) => {
	const { farm, role } = await requireFarmAccess(event, event.params.farmId, 'farm:view');
	return {
		farm: { id: farm.id, name: farm.name },
		canEdit: roleAllows(role, 'plan:edit'),
		canDelete: roleAllows(role, 'plan:delete'),
		plans: await listPlansByFarm(db, farm.id)
	};
}) satisfies PageServerLoad;

/** The farm's plan a form names; 404 for any other. */
async function planOf(farmId: string, form: FormData) {
	const plan = await findPlan(db, farmId, String(form.get('planId') ?? ''));
	if (!plan) error(404, 'Plan not found.');
	return plan;
}

export const actions = {
	/** A new plan as a copy of one the farm has (the reference plan, usually), under a new name. */
	copy: async (event) => {
		const { user, farm } = await requireFarmAccess(event, event.params.farmId, 'plan:edit');
		const form = await event.request.formData();
		const plan = await planOf(farm.id, form);
		const parsed = planCopySchema.safeParse({ name: String(form.get('name') ?? '') });
		if (!parsed.success) {
			return fail(400, { action: 'copy', issues: toFieldIssues(parsed.error) });
		}
		const checked = await checkVersion(db, farm, plan, plan.currentVersion);
		if (!checked?.ok) return fail(400, { action: 'copy', issues: checked?.issues ?? [] });
		const saved = await copyPlan(db, {
			farmId: farm.id,
			userId: user.id,
			plan,
			name: parsed.data.name
		});
		redirect(303, `/farms/${farm.id}/plans/${saved.planId}`);
	},
	/** A plan file (format 1 or 2) as a new plan; a file with any problem saves nothing. */
	import: async (event) => {
		const { user, farm } = await requireFarmAccess(event, event.params.farmId, 'plan:edit');
		const file = (await event.request.formData()).get('file');
		if (!(file instanceof File) || file.size === 0) {
			return fail(400, { action: 'import', issues: [noFile] });
		}
		if (file.size > maxPlanFileBytes) {
			return fail(400, {
				action: 'import',
				issues: [{ path: 'file', message: 'A plan file is at most 2 MB.' }]
			});
		}
		let json: unknown;
		try {
			json = JSON.parse(await file.text());
		} catch {
			return fail(400, {
				action: 'import',
				issues: [{ path: '(document)', message: 'The file is not JSON: choose a plan file.' }]
			});
		}
		const parsed = parsePlanDocument(json);
		if (!parsed.ok) return fail(400, { action: 'import', issues: parsed.issues });
		const saved = await importCheckedPlan(db, farm, user.id, parsed.plan);
		if (!saved.ok) return fail(400, { action: 'import', issues: saved.issues });
		redirect(303, `/farms/${farm.id}/plans/${saved.planId}`);
	},
	reference: async (event) => {
		const { user, farm } = await requireFarmAccess(event, event.params.farmId, 'plan:edit');
		const plan = await planOf(farm.id, await event.request.formData());
		await makeReferencePlan(db, farm.id, user.id, plan);
		return { action: 'reference', done: `"${plan.name}" is now the farm's reference plan.` };
	},
	delete: async (event) => {
		const { user, farm } = await requireFarmAccess(event, event.params.farmId, 'plan:delete');
		const plan = await planOf(farm.id, await event.request.formData());
		if (!(await deletePlan(db, farm.id, user.id, plan))) {
			return fail(409, {
				action: 'delete',
				issues: [{ path: 'planId', message: referencePlanDeleteMessage(plan.name) }]
			});
		}
		return { action: 'delete', done: `"${plan.name}" was deleted.` };
	}
} satisfies Actions;

const noFile = { path: 'file', message: 'Choose a plan file (.json) to import.' };
