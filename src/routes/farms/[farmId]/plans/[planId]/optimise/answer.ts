// How the page words and lays out an optimiser answer: pure functions of the answer and the farm's
// rotations, so the answer, the trade-off's chosen point and the save form read it the same way.
import type { FieldChoice, OptimiseResult, OptimiseStatus } from '$lib/engine/optimiser/types';
import type { RotationYear } from '$lib/server/practices';

/** The page's answer: the mix and the plan as it stands, evaluated alike (null: not asked yet). */
export interface Answer {
	result: OptimiseResult;
	current: { netReturnUsd: number; years: OptimiseResult['years'] } | null;
}

export const statusWords = new Map<OptimiseStatus, string>([
	['optimal', 'The best mix there is under these limits.'],
	['infeasible', 'No mix of rotations keeps every limit.'],
	['time-limit', 'Stopped at the time limit: this is the best mix found so far.'],
	['unbounded', 'The net return could grow without end: a limit the farm needs is missing.'],
	['error', 'The optimiser could not work this out.']
]);

/** Advice for a conflicting limit, by the model row's name (`family_labour_2027_10`, `nitrogen_2028`). */
export function conflictAdvice(name: string): string {
	if (name.startsWith('family_labour')) {
		return 'Allow more family hours in those months, or take off a weight that spares them.';
	}
	if (name === 'hired')
		return "Allow more family hours, or add hired help on the farm's people page.";
	if (name.startsWith('nitrogen'))
		return 'Allow more purchased N, or allow rotations with a legume year.';
	if (name.startsWith('diesel')) return 'Allow more diesel, or allow rotations with fewer passes.';
	if (name.startsWith('crop')) return 'Widen the crop limit, or allow more rotations.';
	if (name.startsWith('field')) {
		return 'Let the optimiser choose this field, or allow a rotation that suits it.';
	}
	if (name.startsWith('forage')) return 'Allow rotations that grow forage or grazing for the herd.';
	return 'Loosen this limit or leave it out.';
}

export interface RotationShown {
	key: string;
	name: string;
	years: RotationYear[];
}

/** The practice a rotation gives in the plan's `yearIndex`-th year from its starting phase. */
export function yearOf(rotation: RotationShown | undefined, startingPhase: number, i: number) {
	if (!rotation || rotation.years.length === 0) return undefined;
	return rotation.years[(startingPhase - 1 + i) % rotation.years.length];
}

/** One grid row per field and rotation it takes: a split field has a row for each share. */
export function gridRows(fields: FieldChoice[]) {
	return fields.flatMap((field) =>
		field.rotations.map((rotation, k) => ({
			key: `${field.fieldId}:${k}`,
			fieldName: field.fieldName,
			fieldAcres: field.acres,
			share: field.split ? rotation.acres / field.acres : 1,
			rotation
		}))
	);
}

/**
 * The fields as a plan's `fieldRotations`: each field's rotation as picked (a split field's pick is
 * its rotation's index, the largest share by default).
 */
export function fieldRotationsOf(fields: FieldChoice[], picks: Map<string, number>) {
	return fields
		.filter((field) => field.rotations.length > 0)
		.map((field) => {
			const rotation = field.rotations[picks.get(field.fieldId) ?? 0] ?? field.rotations[0];
			return {
				fieldId: field.fieldId,
				rotationId: rotation.rotationId,
				startingPhase: rotation.startingPhase
			};
		});
}
