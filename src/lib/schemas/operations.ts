import { z } from 'zod';
import { operationDefaultsById } from '../operation-defaults';
import { amount, choice, id, month, type Range } from './messages';
import { fieldOperationSchema } from './plan-file';

/**
 * Field operations as the operations pages and `/api/v1/farms/[farmId]/operations` take them: the plan
 * file's own operation schemas. An operation's `id` in the API is the database's (it is in URLs); the
 * plan file's operation id is its `key`, made from the name (or the default copied) when not given.
 */

const [ownSchemas, customSchema] = fieldOperationSchema.options;
const [machineSchema, perAcreSchema] = ownSchemas.options;

const copiedFromSchema = z
	.string({ error: 'Give copiedFrom as the id of a catalogue default, as text.' })
	.refine((value) => operationDefaultsById.has(value), {
		error: (issue) =>
			`"${String(issue.input)}" is not a catalogue default: GET /api/v1/operation-defaults lists them.`
	})
	.nullable()
	.optional()
	.describe('The id of the catalogue default the operation was copied from; null: the farm’s own.');

const extra = { key: id('the operation key').optional(), copiedFrom: copiedFromSchema };

/** An operation as the API takes it (POST; PATCH merges its body over the stored operation first). */
export const operationBodySchema = z.discriminatedUnion('by', [
	z.discriminatedUnion('statedAs', [
		machineSchema.omit({ id: true }).extend(extra),
		perAcreSchema.omit({ id: true }).extend(extra)
	]),
	customSchema.omit({ id: true }).extend(extra)
]);
export type OperationBody = z.output<typeof operationBodySchema>;

/** How the form asks an operation to be stated: by its machine, by per-acre rates, or hired. */
export const operationKinds = ['machine', 'per-acre', 'custom'] as const;
export type OperationKind = (typeof operationKinds)[number];

/**
 * The form's inputs that take a quantity, with the plan-file value each states. The form shows them in
 * the farm's units (km/h, m, L/ha… for a metric farm); the server converts them to the plan file's.
 */
export const operationQuantities = {
	speed: { label: 'the speed', schema: machineSchema.shape.speedMph },
	width: { label: 'the working width', schema: machineSchema.shape.widthFt },
	fieldEfficiencyPercent: {
		label: 'the field efficiency',
		schema: machineSchema.shape.fieldEfficiencyPercent
	},
	dieselPerArea: { label: 'diesel per acre', schema: perAcreSchema.shape.dieselGallonsPerAcre },
	tractorPower: {
		label: 'the tractor PTO power',
		schema: machineSchema.shape.fuel.options[1].shape.tractorMaxPtoHp
	},
	dieselPerPowerHour: {
		label: 'diesel per hp-hour',
		schema: machineSchema.shape.fuel.options[1].shape.dieselGallonsPerHpHour.unwrap()
	},
	labourFactor: { label: 'the labour factor', schema: machineSchema.shape.labourFactor.unwrap() },
	repairsPerArea: { label: 'repairs', schema: machineSchema.shape.repairsUsdPerAcre },
	machineHoursPerArea: {
		label: 'machine hours per acre',
		schema: perAcreSchema.shape.machineHoursPerAcre
	},
	labourHoursPerArea: {
		label: 'labour hours per acre',
		schema: perAcreSchema.shape.labourHoursPerAcre
	}
} as const;
export type OperationQuantity = keyof typeof operationQuantities;

/** One quantity input in the farm's units: its label, range and how many decimals it keeps. */
export interface ShownQuantity extends Range {
	/** The label in the messages, in the farm's units ("diesel per hectare"). */
	label: string;
	/** Written after the figure in labels and headers: 'mph', 'km/h', 'gal/ac', 'L/ha'. */
	symbol: string;
	/** Shown value per plan-file value (1 for US customary). */
	factor: number;
	/** Decimals kept, the database column's for US customary. */
	digits: number;
}
export type OperationFormUnits = Record<OperationQuantity, ShownQuantity>;

/** Which inputs each way of stating an operation needs (the rest are not shown and not saved). */
export const inputsByKind: ReadonlyMap<OperationKind, readonly OperationQuantity[]> = new Map([
	[
		'machine',
		['speed', 'width', 'fieldEfficiencyPercent', 'labourFactor', 'repairsPerArea'] as const
	],
	[
		'per-acre',
		['dieselPerArea', 'machineHoursPerArea', 'labourHoursPerArea', 'repairsPerArea'] as const
	],
	['custom', [] as const]
]);
/** A machine's fuel: diesel per area, or from the tractor's PTO power. */
export const fuelInputs = new Map([
	['per-acre', ['dieselPerArea'] as const],
	['pto-power', ['tractorPower', 'dieselPerPowerHour'] as const]
]);

/**
 * The operation form, with its quantities in the farm's units (`units` comes from the server). A value is
 * checked against its range only when the chosen way of stating the operation uses it, so a value left
 * in an input that is now hidden never blocks saving.
 */
export function operationFormSchema(units: OperationFormUnits) {
	const ranged = new Map(
		Object.entries(units).map(([key, { label, ...range }]) => [key, amount(label, range)])
	);
	const quantity = z.number({ error: 'Enter a number.' }).nullable();
	return z
		.object({
			name: machineSchema.shape.name,
			month: month("the operation's month"),
			kind: choice('how the operation is stated', operationKinds),
			fuelBasis: choice('the fuel basis', ['per-acre', 'pto-power']),
			speed: quantity,
			width: quantity,
			fieldEfficiencyPercent: quantity,
			dieselPerArea: quantity,
			tractorPower: quantity,
			dieselPerPowerHour: quantity,
			labourFactor: quantity,
			repairsPerArea: quantity,
			machineHoursPerArea: quantity,
			labourHoursPerArea: quantity
		})
		.superRefine((form, ctx) => {
			for (const key of neededInputs(form)) {
				// A needed value left empty gets the message a missing number gets in the API.
				const checked = ranged.get(key)!.safeParse(form[key] ?? undefined);
				if (!checked.success) {
					ctx.addIssue({ code: 'custom', path: [key], message: checked.error.issues[0].message });
				}
			}
		});
}
export type OperationForm = z.output<ReturnType<typeof operationFormSchema>>;

/** The quantity inputs the form's choices need. */
export function neededInputs(
	form: Pick<OperationForm, 'kind' | 'fuelBasis'>
): readonly OperationQuantity[] {
	const inputs = inputsByKind.get(form.kind) ?? [];
	return form.kind === 'machine' ? [...inputs, ...(fuelInputs.get(form.fuelBasis) ?? [])] : inputs;
}
