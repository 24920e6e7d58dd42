// The optimiser page's form as the browser holds it, and the options it sends: an empty number box is
// a limit left out (null), as the options schema reads it.
import type { OptimiseOptionsInput } from '$lib/schemas/optimise';

/** What a number box holds: a number, or nothing (Svelte binds an empty box as null). */
export type Entry = number | null | undefined;

export interface CropLimitForm {
	cropId: string;
	cropName: string;
	minAcres: Entry;
	maxAcres: Entry;
	maxSharePercent: Entry;
}

export interface OptionsForm {
	wholeFields: boolean;
	timeLimitSeconds: Entry;
	/** Whole fields: stop once within this percent of the best possible. */
	gapPercent: Entry;
	familyLabourHoursByMonth: Entry[];
	/** A cap on the family's hours over some months, each year (off: no such cap). */
	span: { on: boolean; months: number[]; maxHours: Entry };
	nitrogenPurchasedLbPerYear: Entry;
	dieselGallonsPerYear: Entry;
	crops: CropLimitForm[];
	/** Field key → the rotation it keeps ('' : the optimiser chooses) and its phase (null: any). */
	fixedFields: { fieldId: string; rotationId: string; startingPhase: Entry }[];
	/** The rotations it may choose from; every one of the farm's means no limit. */
	rotationIds: string[];
	weights: {
		familyLabourUsdPerHour: Entry;
		nitrogenUsdPerLb: Entry;
		dieselUsdPerGallon: Entry;
		grazingUsdPerAuDay: Entry;
	};
}

const orNull = (value: Entry) => (value === undefined || value === null ? null : value);

export function initialForm(data: {
	familyHoursByMonth: number[];
	crops: { id: string; name: string }[];
	fields: { key: string }[];
	rotations: { key: string }[];
}): OptionsForm {
	return {
		wholeFields: false,
		timeLimitSeconds: 10,
		gapPercent: 0.5,
		familyLabourHoursByMonth: [...data.familyHoursByMonth],
		span: { on: false, months: [9, 10, 11], maxHours: null },
		nitrogenPurchasedLbPerYear: null,
		dieselGallonsPerYear: null,
		crops: data.crops.map((crop) => ({
			cropId: crop.id,
			cropName: crop.name,
			minAcres: null,
			maxAcres: null,
			maxSharePercent: null
		})),
		fixedFields: data.fields.map((field) => ({
			fieldId: field.key,
			rotationId: '',
			startingPhase: null
		})),
		rotationIds: data.rotations.map((r) => r.key),
		weights: {
			familyLabourUsdPerHour: 0,
			nitrogenUsdPerLb: 0,
			dieselUsdPerGallon: 0,
			grazingUsdPerAuDay: 0
		}
	};
}

/**
 * The options to send. Numbers go as typed (the server's schema states each range); a crop with no
 * limit and a field left to the optimiser are not sent, so issue paths count only what was sent:
 * `crops` and `fixedFields` keep each sent row's place in the form beside it.
 */
export function optionsOf(
	form: OptionsForm,
	allRotationKeys: string[]
): {
	options: OptimiseOptionsInput;
	cropRows: number[];
	fixedRows: number[];
} {
	const cropRows = form.crops.flatMap((crop, i) =>
		[crop.minAcres, crop.maxAcres, crop.maxSharePercent].some((v) => orNull(v) !== null) ? [i] : []
	);
	const fixedRows = form.fixedFields.flatMap((f, i) => (f.rotationId ? [i] : []));
	const everyRotation = allRotationKeys.every((key) => form.rotationIds.includes(key));
	return {
		cropRows,
		fixedRows,
		options: {
			wholeFields: form.wholeFields,
			timeLimitSeconds: form.timeLimitSeconds ?? undefined,
			gapPercent: form.gapPercent ?? undefined,
			limits: {
				// An empty month goes as null, for the schema to refuse by its month.
				familyLabourHoursByMonth: form.familyLabourHoursByMonth.map((h) => h ?? null) as number[],
				familyLabourSpan: form.span.on
					? { months: [...form.span.months].sort((a, b) => a - b), maxHours: form.span.maxHours! }
					: null,
				nitrogenPurchasedLbPerYear: orNull(form.nitrogenPurchasedLbPerYear),
				dieselGallonsPerYear: orNull(form.dieselGallonsPerYear),
				crops: cropRows.map((i) => {
					const crop = form.crops[i];
					return {
						cropId: crop.cropId,
						minAcres: orNull(crop.minAcres),
						maxAcres: orNull(crop.maxAcres),
						maxSharePercent: orNull(crop.maxSharePercent)
					};
				}),
				fixedFields: fixedRows.map((i) => {
					const fixed = form.fixedFields[i];
					return {
						fieldId: fixed.fieldId,
						rotationId: fixed.rotationId,
						startingPhase: orNull(fixed.startingPhase)
					};
				}),
				rotationIds: everyRotation ? null : form.rotationIds
			},
			weights: {
				familyLabourUsdPerHour: form.weights.familyLabourUsdPerHour ?? 0,
				nitrogenUsdPerLb: form.weights.nitrogenUsdPerLb ?? 0,
				dieselUsdPerGallon: form.weights.dieselUsdPerGallon ?? 0,
				grazingUsdPerAuDay: form.weights.grazingUsdPerAuDay ?? 0
			}
		}
	};
}

/**
 * An answer's issue paths as the form's own: `limits.crops.0.maxSharePercent` names the first crop
 * sent, which is the form's row `cropRows[0]`.
 */
export function formPaths(
	issues: { path: string; message: string }[],
	rows: { cropRows: number[]; fixedRows: number[] },
	prefix = ''
): Map<string, string> {
	const byPath = new Map<string, string>();
	for (const issue of issues) {
		const path = issue.path.startsWith(prefix) ? issue.path.slice(prefix.length) : issue.path;
		const shown = path
			.replace(/^limits\.crops\.(\d+)/, (_, i) => `limits.crops.${rows.cropRows[Number(i)] ?? i}`)
			.replace(
				/^limits\.fixedFields\.(\d+)/,
				(_, i) => `limits.fixedFields.${rows.fixedRows[Number(i)] ?? i}`
			);
		if (!byPath.has(shown)) byPath.set(shown, issue.message);
	}
	return byPath;
}
