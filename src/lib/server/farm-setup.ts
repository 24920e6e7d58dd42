// What the fields and crops pages and API share: refusals worded once, and the area in the farm's unit.
import { toMetric, toUs } from '$lib/engine/units';
import { setError, type FormPathLeavesWithErrors, type SuperValidated } from 'sveltekit-superforms';
import { cropSchema, type CropDefinition } from '$lib/schemas/crops';
import { fieldFormSchema, type CropForm, type FieldFormRanges } from '$lib/schemas/farm-setup';
import { toFieldIssues } from '$lib/schemas/issues';
import { fieldSchema } from '$lib/schemas/plan-file';
import { unitSystems, type UnitSystem } from '$lib/unit-systems';
import { displayUnits } from './display-units';

const quoted = (names: string[]) => names.map((name) => `"${name}"`).join(', ');

export function fieldKeyTakenMessage(key: string): string {
	return `Another field of this farm has the key "${key}": choose another.`;
}

export function fieldInUseMessage(name: string, planNames: string[]): string {
	const one = planNames.length === 1;
	return `${name} is in ${one ? 'the plan' : 'the plans'} ${quoted(planNames)}: take it out of ${one ? 'that plan' : 'those plans'} before deleting it.`;
}

export function cropIdTakenMessage(id: string, builtIn: boolean): string {
	return builtIn
		? `"${id}" is a built-in crop: give your crop another id.`
		: `The farm already has a crop with the id "${id}": choose another.`;
}

export function builtInCropMessage(name: string): string {
	return `${name} is a built-in crop: it cannot be changed or deleted. Add a crop of your own instead.`;
}

export function cropInUseMessage(name: string, practiceNames: string[]): string {
	const one = practiceNames.length === 1;
	return `${name} is grown in ${one ? 'the practice' : 'the practices'} ${quoted(practiceNames)}: change ${one ? 'that practice' : 'those practices'} before deleting it.`;
}

/**
 * The field form's ranges in the farm's unit: the plan file's acre and $/acre ranges, in hectares and
 * $/ha for metric, rounded inwards to the hundredth shown so a value inside is inside in acres too.
 */
export function fieldFormRanges(system: UnitSystem): FieldFormRanges {
	const acres = fieldSchema.shape.acres;
	const rent = fieldSchema.shape.cashRentUsdPerAcre.unwrap();
	const [minAcres, maxAcres, maxRent] = [
		acres.minValue ?? 0,
		acres.maxValue ?? 0,
		rent.maxValue ?? 0
	];
	if (system === 'us') {
		return {
			area: { min: minAcres, max: maxAcres, unit: 'acres' },
			cashRent: { min: 0, max: maxRent, usdPer: 'acre a year' }
		};
	}
	const toHa = (a: number) => toMetric(a, 'area') * 100;
	return {
		area: {
			min: Math.ceil(toHa(minAcres)) / 100,
			max: Math.floor(toHa(maxAcres)) / 100,
			unit: 'ha'
		},
		cashRent: {
			min: 0,
			max: Math.floor(displayUnits('metric').pricePer(maxRent, 'area')! * 100) / 100,
			usdPer: 'hectare a year'
		}
	};
}

/** A field's cash rent for the form: $/ac, or $/ha for metric, to the cent. */
export function shownCashRent(usdPerAcre: number, system: UnitSystem): number {
	return Math.round(displayUnits(system).pricePer(usdPerAcre, 'area')! * 100) / 100;
}

/** The rent typed in the form ($/ac, or $/ha for metric) in $/ac to the cent the table keeps. */
export function cashRentFromShown(shown: number, system: UnitSystem): number {
	const usdPerAcre = system === 'us' ? shown : shown * toMetric(1, 'area');
	return Math.round(usdPerAcre * 100) / 100;
}

/** A field's area for the form: acres, or hectares for metric, to the hundredth. */
export function shownArea(acres: number, system: UnitSystem): number {
	const area = system === 'us' ? acres : toMetric(acres, 'area');
	return Math.round(area * 100) / 100;
}

/** The area typed in the form (acres, or hectares for metric), in acres to the hundredth the table keeps. */
export function acresFromShownArea(area: number, system: UnitSystem): number {
	const acres = system === 'us' ? area : toUs(area, 'area');
	return Math.round(acres * 100) / 100;
}

/** The fields form's schema for each unit system, built once (the form library caches per schema). */
export const fieldFormSchemas = new Map(
	unitSystems.map((system) => [system, fieldFormSchema(fieldFormRanges(system))])
);

/**
 * The crop form's values as a crop, by the crop schema's own checks (a bushel needs its weight; cwt, ton
 * and lb state theirs); undefined after putting the schema's messages on the form beside their inputs.
 */
export function cropFromForm(
	form: SuperValidated<CropForm>,
	id: string
): CropDefinition | undefined {
	const crop = cropSchema.safeParse({ ...form.data, id });
	if (crop.success) return crop.data;
	for (const { path, message } of toFieldIssues(crop.error)) {
		setError(form, path as FormPathLeavesWithErrors<CropForm>, message);
	}
	return undefined;
}
