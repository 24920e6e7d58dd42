// What the operations pages and API share: refusals worded once, the form's inputs in the farm's units,
// and the figures the table shows.
import { ownOperationTotals, perAcreOperationTotals } from '$lib/engine/machinery';
import {
	hectaresPerAcre,
	kmhPerMph,
	kwPerHp,
	litresPerGallon,
	litresPerHaPerGallonPerAcre,
	metresPerFoot
} from '$lib/engine/units';
import {
	neededInputs,
	operationFormSchema,
	operationQuantities,
	type OperationForm,
	type OperationFormUnits,
	type OperationKind,
	type OperationQuantity,
	type ShownQuantity
} from '$lib/schemas/operations';
import { setError, type FormPathLeavesWithErrors, type SuperValidated } from 'sveltekit-superforms';
import { MONTH_ABBREVIATIONS } from '$lib/months';
import { operationDefaultsById } from '$lib/operation-defaults';
import { toFieldIssues } from '$lib/schemas/issues';
import { operationBodySchema, type OperationBody } from '$lib/schemas/operations';
import { unitSystems, type UnitSystem } from '$lib/unit-systems';
import type { OperationRow, StatedOperation } from './db/field-operations';
import { displayUnits } from './display-units';

const quoted = (names: string[]) => names.map((name) => `"${name}"`).join(', ');

export function operationKeyTakenMessage(key: string): string {
	return `Another operation of this farm has the key "${key}": choose another.`;
}

export function operationInUseMessage(name: string, practiceNames: string[]): string {
	const one = practiceNames.length === 1;
	return `${name} is in ${one ? 'the practice' : 'the practices'} ${quoted(practiceNames)}: take it out of ${one ? 'that practice' : 'those practices'} before deleting it.`;
}

type Shown = Omit<ShownQuantity, 'min' | 'max' | 'factor'>;

/** Each input's label and units, US customary then metric, with the plan-file value's decimals (its column's scale). */
const quantityUnits: Record<OperationQuantity, { us: Shown; metric: Shown & { factor: number } }> =
	{
		speed: {
			us: { label: 'the speed', unit: 'mph', symbol: 'mph', digits: 2 },
			metric: { label: 'the speed', unit: 'km/h', symbol: 'km/h', digits: 2, factor: kmhPerMph }
		},
		width: {
			us: { label: 'the working width', unit: 'ft', symbol: 'ft', digits: 2 },
			metric: {
				label: 'the working width',
				unit: 'm',
				symbol: 'm',
				digits: 2,
				factor: metresPerFoot
			}
		},
		fieldEfficiencyPercent: {
			us: { label: 'the field efficiency', unit: '%', symbol: '%', digits: 2 },
			metric: { label: 'the field efficiency', unit: '%', symbol: '%', digits: 2, factor: 1 }
		},
		dieselPerArea: {
			us: { label: 'diesel per acre', unit: 'gal', symbol: 'gal/ac', digits: 3 },
			metric: {
				label: 'diesel per hectare',
				unit: 'L',
				symbol: 'L/ha',
				digits: 2,
				factor: litresPerHaPerGallonPerAcre
			}
		},
		tractorPower: {
			us: { label: 'the tractor PTO power', unit: 'hp', symbol: 'hp', digits: 1 },
			metric: {
				label: 'the tractor PTO power',
				unit: 'kW',
				symbol: 'kW',
				digits: 1,
				factor: kwPerHp
			}
		},
		dieselPerPowerHour: {
			us: { label: 'diesel per hp-hour', unit: 'gal', symbol: 'gal per hp-hour', digits: 4 },
			metric: {
				label: 'diesel per kWh',
				unit: 'L',
				symbol: 'L per kWh',
				digits: 3,
				factor: litresPerGallon / kwPerHp
			}
		},
		labourFactor: {
			us: { label: 'the labour factor', symbol: '× machine hours', digits: 2 },
			metric: { label: 'the labour factor', symbol: '× machine hours', digits: 2, factor: 1 }
		},
		repairsPerArea: {
			us: { label: 'repairs', usdPer: 'acre', symbol: '$/ac', digits: 2 },
			metric: {
				label: 'repairs',
				usdPer: 'hectare',
				symbol: '$/ha',
				digits: 2,
				factor: 1 / hectaresPerAcre
			}
		},
		machineHoursPerArea: {
			us: { label: 'machine hours per acre', unit: 'hours', symbol: 'h/ac', digits: 4 },
			metric: {
				label: 'machine hours per hectare',
				unit: 'hours',
				symbol: 'h/ha',
				digits: 3,
				factor: 1 / hectaresPerAcre
			}
		},
		labourHoursPerArea: {
			us: { label: 'labour hours per acre', unit: 'hours', symbol: 'h/ac', digits: 4 },
			metric: {
				label: 'labour hours per hectare',
				unit: 'hours',
				symbol: 'h/ha',
				digits: 3,
				factor: 1 / hectaresPerAcre
			}
		}
	};

const roundTo = (value: number, digits: number) => Math.round(value * 10 ** digits) / 10 ** digits;
// Bounds rounded inwards to the decimals shown, so a value inside the shown range is inside the plan
// file's once converted (the tolerance keeps 1.1 × 100 = 110.00000000000001 from rounding up).
const ceilTo = (value: number, digits: number) =>
	Math.ceil(value * 10 ** digits - 1e-9) / 10 ** digits;
const floorTo = (value: number, digits: number) =>
	Math.floor(value * 10 ** digits + 1e-9) / 10 ** digits;

function formUnits(system: UnitSystem): OperationFormUnits {
	const entries = Object.entries(operationQuantities).map(([key, { schema }]) => {
		const units = quantityUnits[key as OperationQuantity];
		const min = schema.minValue ?? 0;
		const max = schema.maxValue ?? 0;
		if (system === 'us') return [key, { ...units.us, min, max, factor: 1 }];
		const { factor, digits } = units.metric;
		const range = { min: ceilTo(min * factor, digits), max: floorTo(max * factor, digits) };
		return [key, { ...units.metric, ...range }];
	});
	return Object.fromEntries(entries) as OperationFormUnits;
}

/** The form's inputs in each unit system, built once (the form library caches per schema). */
export const operationFormUnits = new Map(unitSystems.map((system) => [system, formUnits(system)]));
export const operationFormSchemas = new Map(
	unitSystems.map((system) => [system, operationFormSchema(operationFormUnits.get(system)!)])
);

/** How an operation is stated, as the form's one choice. */
export function kindOf(op: Pick<OperationRow, 'by'> & { statedAs?: string }): OperationKind {
	return op.by === 'custom' ? 'custom' : op.statedAs === 'per-acre' ? 'per-acre' : 'machine';
}

/** An operation's values as the form shows them, in the farm's units (defaults for what it does not state). */
export function formValuesOf(op: StatedOperation, units: OperationFormUnits): OperationForm {
	const shown = (key: OperationQuantity, value: number | undefined | null) =>
		value === undefined || value === null
			? null
			: roundTo(value * units[key].factor, units[key].digits);
	const values: OperationForm = {
		name: op.name,
		month: op.month,
		kind: kindOf(op),
		fuelBasis: 'per-acre',
		speed: null,
		width: null,
		fieldEfficiencyPercent: null,
		dieselPerArea: null,
		tractorPower: null,
		// ISU A3-29 (from ASAE D497): 0.044 gal/h per max PTO hp, the plan file's default.
		dieselPerPowerHour: shown('dieselPerPowerHour', 0.044),
		// farmdoc: labour hours = 1.1 × machine hours, the plan file's default.
		labourFactor: shown('labourFactor', 1.1),
		repairsPerArea: null,
		machineHoursPerArea: null,
		labourHoursPerArea: null
	};
	if (op.by === 'custom') return values;
	if (op.statedAs === 'per-acre') {
		return {
			...values,
			dieselPerArea: shown('dieselPerArea', op.dieselGallonsPerAcre),
			machineHoursPerArea: shown('machineHoursPerArea', op.machineHoursPerAcre),
			labourHoursPerArea: shown('labourHoursPerArea', op.labourHoursPerAcre),
			repairsPerArea: shown('repairsPerArea', op.repairsUsdPerAcre)
		};
	}
	return {
		...values,
		speed: shown('speed', op.speedMph),
		width: shown('width', op.widthFt),
		fieldEfficiencyPercent: shown('fieldEfficiencyPercent', op.fieldEfficiencyPercent),
		fuelBasis: op.fuel.basis,
		dieselPerArea:
			op.fuel.basis === 'per-acre' ? shown('dieselPerArea', op.fuel.dieselGallonsPerAcre) : null,
		tractorPower:
			op.fuel.basis === 'pto-power' ? shown('tractorPower', op.fuel.tractorMaxPtoHp) : null,
		dieselPerPowerHour:
			op.fuel.basis === 'pto-power'
				? shown('dieselPerPowerHour', op.fuel.dieselGallonsPerHpHour)
				: values.dieselPerPowerHour,
		labourFactor: shown('labourFactor', op.labourFactor),
		repairsPerArea: shown('repairsPerArea', op.repairsUsdPerAcre)
	};
}

/**
 * The form's values as an operation body (plan-file units), for the API's schema to check. A value left
 * as shown keeps the stored one (a metric figure to two decimals does not round-trip exactly).
 */
export function operationFromForm(
	form: OperationForm,
	units: OperationFormUnits,
	stored?: StatedOperation
): Record<string, unknown> {
	const before = stored ? formValuesOf(stored, units) : undefined;
	const storedUs = stored ? usValuesOf(stored) : undefined;
	const us = (key: OperationQuantity) => {
		const value = form[key];
		if (value === null) return undefined;
		if (before && before[key] === value && storedUs?.has(key)) return storedUs.get(key);
		return roundTo(value / units[key].factor, quantityUnits[key].us.digits);
	};
	const common = { name: form.name, month: form.month };
	const needed = new Set(neededInputs(form));
	const pick = (key: OperationQuantity) => (needed.has(key) ? us(key) : undefined);
	if (form.kind === 'custom') return { ...common, by: 'custom' };
	if (form.kind === 'per-acre') {
		return {
			...common,
			by: 'own',
			statedAs: 'per-acre',
			dieselGallonsPerAcre: pick('dieselPerArea'),
			machineHoursPerAcre: pick('machineHoursPerArea'),
			labourHoursPerAcre: pick('labourHoursPerArea'),
			repairsUsdPerAcre: pick('repairsPerArea')
		};
	}
	const fuel =
		form.fuelBasis === 'pto-power'
			? {
					basis: 'pto-power',
					tractorMaxPtoHp: pick('tractorPower'),
					dieselGallonsPerHpHour: pick('dieselPerPowerHour')
				}
			: { basis: 'per-acre', dieselGallonsPerAcre: pick('dieselPerArea') };
	return {
		...common,
		by: 'own',
		statedAs: 'machine',
		speedMph: pick('speed'),
		widthFt: pick('width'),
		fieldEfficiencyPercent: pick('fieldEfficiencyPercent'),
		fuel,
		labourFactor: pick('labourFactor'),
		repairsUsdPerAcre: pick('repairsPerArea')
	};
}

/** The form input each body path is shown beside. */
export const inputOfPath = new Map<string, OperationQuantity>([
	['speedMph', 'speed'],
	['widthFt', 'width'],
	['fieldEfficiencyPercent', 'fieldEfficiencyPercent'],
	['fuel.dieselGallonsPerAcre', 'dieselPerArea'],
	['dieselGallonsPerAcre', 'dieselPerArea'],
	['fuel.tractorMaxPtoHp', 'tractorPower'],
	['fuel.dieselGallonsPerHpHour', 'dieselPerPowerHour'],
	['labourFactor', 'labourFactor'],
	['repairsUsdPerAcre', 'repairsPerArea'],
	['machineHoursPerAcre', 'machineHoursPerArea'],
	['labourHoursPerAcre', 'labourHoursPerArea']
]);

/** The stored operation's plan-file values by form input. */
function usValuesOf(op: StatedOperation) {
	const values = new Map<OperationQuantity, number>();
	const set = (key: OperationQuantity, value: number | undefined) => {
		if (value !== undefined) values.set(key, value);
	};
	if (op.by === 'custom') return values;
	set('repairsPerArea', op.repairsUsdPerAcre);
	if (op.statedAs === 'per-acre') {
		set('dieselPerArea', op.dieselGallonsPerAcre);
		set('machineHoursPerArea', op.machineHoursPerAcre);
		set('labourHoursPerArea', op.labourHoursPerAcre);
		return values;
	}
	set('speed', op.speedMph);
	set('width', op.widthFt);
	set('fieldEfficiencyPercent', op.fieldEfficiencyPercent);
	set('labourFactor', op.labourFactor);
	if (op.fuel.basis === 'per-acre') set('dieselPerArea', op.fuel.dieselGallonsPerAcre);
	else {
		set('tractorPower', op.fuel.tractorMaxPtoHp);
		set('dieselPerPowerHour', op.fuel.dieselGallonsPerHpHour);
	}
	return values;
}

type Show = ReturnType<typeof displayUnits>;

/**
 * What the operations table shows of one operation, in the farm's units: field capacity (per hour),
 * hours, diesel, labour and repairs per area. The engine's own functions compute them; null where the
 * operation does not state it (hired work, capacity of a per-acre operation).
 */
export function operationFigures(op: StatedOperation, show: Show) {
	const none = {
		fieldCapacityPerHour: null,
		hoursPer100: null,
		dieselPerArea: null,
		labourHoursPerArea: null,
		repairsPerArea: null
	};
	if (op.by === 'custom') return none;
	// Totals over 100 acres, at no price: the hours, gallons and labour of 100 acres.
	const totals =
		op.statedAs === 'per-acre'
			? perAcreOperationTotals({ ...op, repairsUsdPerAcre: op.repairsUsdPerAcre ?? 0 }, 100, 0, 0)
			: ownOperationTotals({ ...op, labourFactor: op.labourFactor ?? 1.1 }, 100, 0, 0);
	const perAcre = (value: number) => value / 100;
	return {
		fieldCapacityPerHour: show.amount(totals.fieldCapacityAcresPerHour, 'area'),
		// Hours per 100 acres is machine hours per acre × 100; per 100 ha likewise.
		hoursPer100: show.pricePer(totals.machineHours, 'area'),
		dieselPerArea: show.amount(perAcre(totals.dieselGallons), 'volumeRate'),
		labourHoursPerArea: show.pricePer(perAcre(totals.labourHours), 'area'),
		repairsPerArea: show.pricePer(perAcre(totals.repairsUsd), 'area')
	};
}

/**
 * The form's values as an operation body, checked by the API's own schema; undefined after putting its
 * messages on the form beside their inputs.
 */
export function operationBodyFromForm(
	form: SuperValidated<OperationForm>,
	units: OperationFormUnits,
	stored?: StatedOperation
): OperationBody | undefined {
	const body = operationBodySchema.safeParse(operationFromForm(form.data, units, stored));
	if (body.success) return body.data;
	for (const { path, message } of toFieldIssues(body.error)) {
		const input = inputOfPath.get(path) ?? (path === 'name' || path === 'month' ? path : 'kind');
		setError(form, input as FormPathLeavesWithErrors<OperationForm>, message);
	}
	return undefined;
}

const statedAsLabels = new Map<OperationKind, string>([
	['machine', 'speed and width'],
	['per-acre', 'rates per acre'],
	['custom', 'hired']
]);

/** The units of the operations table's headers, in the farm's system. */
export function operationTableUnits(system: UnitSystem) {
	const show = displayUnits(system);
	const area = show.unit('area');
	return { area, diesel: show.unit('volumeRate') };
}

/** One operation (the farm's or a default) as a table row shows it. */
export function shownOperation(op: StatedOperation, system: UnitSystem) {
	return {
		name: op.name,
		by: op.by === 'custom' ? 'hired' : 'own',
		month: MONTH_ABBREVIATIONS[op.month - 1],
		statedAs: statedAsLabels.get(kindOf(op))!,
		...operationFigures(op, displayUnits(system))
	};
}

/** The source of the default an operation was copied from, or null for the farm's own. */
export function sourceOf(copiedFrom: string | null): { name: string; source: string } | null {
	const copied = copiedFrom === null ? undefined : operationDefaultsById.get(copiedFrom);
	return copied ? { name: copied.name, source: copied.source } : null;
}

/** What an operation states, in words and the farm's units, for those who read it without the form. */
export function statedValues(op: StatedOperation, units: OperationFormUnits): string[] {
	const values = formValuesOf(op, units);
	const say = (key: OperationQuantity, label: string) => {
		const value = values[key];
		if (value === null) return [];
		// Dollars lead: "repairs $2.50/ac", not "2.5 $/ac".
		if (units[key].usdPer) return [`${label} $${value.toFixed(2)}${units[key].symbol.slice(1)}`];
		return [`${label} ${value} ${units[key].symbol}`];
	};
	if (op.by === 'custom') return ["Hired at the price set's custom rate"];
	if (op.statedAs === 'per-acre') {
		return [
			...say('dieselPerArea', 'diesel'),
			...say('machineHoursPerArea', 'machine'),
			...say('labourHoursPerArea', 'labour'),
			...say('repairsPerArea', 'repairs')
		];
	}
	return [
		...say('speed', 'speed'),
		...say('width', 'width'),
		...say('fieldEfficiencyPercent', 'field efficiency'),
		...(values.fuelBasis === 'pto-power'
			? [...say('tractorPower', 'tractor'), ...say('dieselPerPowerHour', 'diesel')]
			: say('dieselPerArea', 'diesel')),
		...say('labourFactor', 'labour'),
		...say('repairsPerArea', 'repairs')
	];
}
