import { error, redirect } from '@sveltejs/kit';
import { fail, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { hectaresPerAcre } from '$lib/engine/units';
import { operationKinds } from '$lib/schemas/operations';
import { requireFarmAccess, roleAllows } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import {
	deleteFieldOperation,
	findFieldOperationById,
	listPracticesUsingOperation,
	updateFieldOperation
} from '$lib/server/db/field-operations';
import {
	formValuesOf,
	operationBodyFromForm,
	operationFormSchemas,
	operationFormUnits,
	operationInUseMessage,
	operationTableUnits,
	shownOperation,
	sourceOf,
	statedValues
} from '$lib/server/operation-setup';
import type { Actions, PageServerLoad } from './$types';

// Reviewers read the operation's figures; editors get the form. `?confirm=delete` asks before deleting
// and `?as=…` shows another way of stating it: page states, so both work without JavaScript.
export const load = (async (event) => {
	const { farm, role } = await requireFarmAccess(event, event.params.farmId, 'farm:view');
	const canEdit = roleAllows(role, 'farm:edit');
	const {
		id,
		key: _key,
		copiedFrom,
		...op
	} = await operationOr404(farm.id, event.params.operationId);
	const units = operationFormUnits.get(farm.unitSystem)!;
	const as = operationKinds.find((kind) => kind === event.url.searchParams.get('as'));
	const confirmDelete = canEdit && event.url.searchParams.get('confirm') === 'delete';
	const [form, practicesUsing] = await Promise.all([
		canEdit
			? superValidate(
					{ ...formValuesOf(op, units), ...(as ? { kind: as } : {}) },
					zod4(operationFormSchemas.get(farm.unitSystem)!),
					{ errors: false }
				)
			: null,
		confirmDelete ? listPracticesUsingOperation(db, id) : []
	]);
	return {
		farm: { id: farm.id, name: farm.name },
		operation: { id, ...shownOperation(op, farm.unitSystem), stated: statedValues(op, units) },
		copied: sourceOf(copiedFrom),
		canEdit,
		confirmDelete,
		inUse: practicesUsing.length ? operationInUseMessage(op.name, practicesUsing) : null,
		units: operationTableUnits(farm.unitSystem),
		form,
		formUnits: units,
		areaPerAcre: farm.unitSystem === 'metric' ? hectaresPerAcre : 1
	};
}) satisfies PageServerLoad;

export const actions = {
	update: async (event) => {
		const { user, farm } = await requireFarmAccess(event, event.params.farmId, 'farm:edit');
		const { id, key, copiedFrom, ...stored } = await operationOr404(
			farm.id,
			event.params.operationId
		);
		const form = await superValidate(
			event.request,
			zod4(operationFormSchemas.get(farm.unitSystem)!)
		);
		if (!form.valid) return fail(400, { form });
		const body = operationBodyFromForm(form, operationFormUnits.get(farm.unitSystem)!, stored);
		if (!body) return fail(400, { form });
		await updateFieldOperation(db, farm.id, user.id, id, { ...body, key, copiedFrom });
		redirect(303, `/farms/${farm.id}/operations`);
	},
	delete: async (event) => {
		const { user, farm } = await requireFarmAccess(event, event.params.farmId, 'farm:edit');
		const operation = await operationOr404(farm.id, event.params.operationId);
		const result = await deleteFieldOperation(db, farm.id, user.id, operation);
		if (!result.deleted) {
			return fail(409, { refused: operationInUseMessage(operation.name, result.practiceNames) });
		}
		redirect(303, `/farms/${farm.id}/operations`);
	}
} satisfies Actions;

async function operationOr404(farmId: string, operationId: string) {
	const operation = await findFieldOperationById(db, farmId, operationId);
	if (!operation) error(404, 'Operation not found.');
	return operation;
}
