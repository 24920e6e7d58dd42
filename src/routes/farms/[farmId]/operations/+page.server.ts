import { redirect } from '@sveltejs/kit';
import { fail, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { hectaresPerAcre } from '$lib/engine/units';
import { operationDefaults, operationDefaultsById } from '$lib/operation-defaults';
import { operationBodySchema, operationKinds } from '$lib/schemas/operations';
import { requireFarmAccess, roleAllows } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import { addFieldOperations, listFieldOperations } from '$lib/server/db/field-operations';
import {
	operationBodyFromForm,
	operationFormSchemas,
	operationFormUnits,
	operationTableUnits,
	shownOperation,
	sourceOf
} from '$lib/server/operation-setup';
import type { Actions, PageServerLoad } from './$types';

// A new operation is stated by its machine unless `?as=per-acre|custom` asks otherwise (the way to
// choose without JavaScript).
export const load = (async (event) => {
	const { farm, role } = await requireFarmAccess(event, event.params.farmId, 'farm:view');
	const canEdit = roleAllows(role, 'farm:edit');
	const as = operationKinds.find((kind) => kind === event.url.searchParams.get('as')) ?? 'machine';
	const [rows, form] = await Promise.all([
		listFieldOperations(db, farm.id),
		canEdit
			? superValidate(
					{ kind: as, month: 5, fuelBasis: 'per-acre', labourFactor: 1.1 },
					zod4(operationFormSchemas.get(farm.unitSystem)!),
					{ errors: false }
				)
			: null
	]);
	return {
		farm: { id: farm.id, name: farm.name },
		canEdit,
		units: operationTableUnits(farm.unitSystem),
		operations: rows.map((op) => ({
			id: op.id,
			...shownOperation(op, farm.unitSystem),
			copied: sourceOf(op.copiedFrom)
		})),
		defaults: operationDefaults.map(({ id, source, ...op }) => ({
			id,
			source,
			...shownOperation(op, farm.unitSystem)
		})),
		form,
		formUnits: operationFormUnits.get(farm.unitSystem)!,
		areaPerAcre: farm.unitSystem === 'metric' ? hectaresPerAcre : 1
	};
}) satisfies PageServerLoad;

export const actions = {
	create: async (event) => {
		const { user, farm } = await requireFarmAccess(event, event.params.farmId, 'farm:edit');
		const form = await superValidate(
			event.request,
			zod4(operationFormSchemas.get(farm.unitSystem)!)
		);
		if (!form.valid) return fail(400, { form });
		const body = operationBodyFromForm(form, operationFormUnits.get(farm.unitSystem)!);
		if (!body) return fail(400, { form });
		const result = await addFieldOperations(db, farm.id, user.id, [body]);
		// No key is asked for, so one is always made.
		const [added] = 'added' in result ? result.added : [];
		redirect(303, `/farms/${farm.id}/operations?added=${encodeURIComponent(added.key)}`);
	},
	copy: async (event) => {
		const { user, farm } = await requireFarmAccess(event, event.params.farmId, 'farm:edit');
		const chosen = (await event.request.formData()).get('default');
		const copied = typeof chosen === 'string' ? operationDefaultsById.get(chosen) : undefined;
		if (!copied) return fail(400, { refused: 'Choose an operation from the catalogue to copy.' });
		const { id, source: _source, ...values } = copied;
		const body = operationBodySchema.parse({ ...values, copiedFrom: id });
		const result = await addFieldOperations(db, farm.id, user.id, [body]);
		const [added] = 'added' in result ? result.added : [];
		redirect(
			303,
			`/farms/${farm.id}/operations?copied=${encodeURIComponent(added.key)}#farm-operations`
		);
	}
} satisfies Actions;
