import { z } from 'zod';
import { choice, id, list, yesNo } from './messages';
import { cropPracticeSchema, rotationSchema } from './plan-file';

/**
 * Crop practices and rotations as the practices and rotations pages and `/api/v1/farms/[farmId]/practices
 * | rotations` take them: the plan file's own schemas. As for fields, a practice's or rotation's `id` in
 * the API is the database's (it appears in URLs) and the plan file's id is its `key`, made from the name
 * when not given. Bodies name a practice's crop by crop id, its operations by their plan-file keys and a
 * rotation's practices by their keys.
 */

/** A practice as the API takes it (POST; PATCH merges its body over the stored practice first). */
export const practiceBodySchema = cropPracticeSchema
	.omit({ id: true })
	.extend({ key: id('the practice key').optional() });
export type PracticeBody = z.output<typeof practiceBodySchema>;

/** The longest rotation the app plans: one practice a year for 1 to 8 years (the plan file allows more). */
export const maxRotationYears = 8;

export const rotationBodySchema = rotationSchema.omit({ id: true }).extend({
	key: id('the rotation key').optional(),
	practices: list('practices', id('the practice key'), { max: maxRotationYears })
		.min(1, { error: 'Give at least one practice: a rotation is 1 to 8 years.' })
		.describe('Practice keys, one per year, in order: 1 to 8 years.')
});
export type RotationBody = z.output<typeof rotationBodySchema>;

// The plan file's own value schemas, reached through the practice schema so no range is written twice.
const shape = cropPracticeSchema.shape;
const nitrogenShape = shape.nitrogen.unwrap().shape;
const responseShape = nitrogenShape.response.unwrap().unwrap().shape;
const seedShape = shape.seed.unwrap().unwrap().shape;
const coverShape = shape.coverMix.unwrap().unwrap().shape;
const speciesShape = coverShape.species.element.shape;
const residueShape = shape.residueGrazing.unwrap().unwrap().shape;
const stepShape = shape.operations.unwrap().element.shape;

export const nitrogenModes = ['rate', 'economic-optimum'] as const;
export const seedRateBases = ['seedsPerAcre', 'lbPerAcre'] as const;

/** Empty select: no seed, no operation, no cover species. */
const optionalKey = (label: string) => id(label).or(z.literal(''));

/**
 * The practice form: the practice flattened so a browser without JavaScript can post it (lists are
 * repeated inputs of one name: operations and cover species are rows of parallel lists; a row with no
 * operation or seed chosen is left out). `practiceFromForm` puts it back into the plan file's shape,
 * which is checked by the same schema as the API body.
 */
export const practiceFormSchema = z.object({
	name: shape.name,
	crop: shape.crop,
	yieldGoalPerAcre: shape.yieldGoalPerAcre,
	yieldAdjustmentPercent: shape.yieldAdjustmentPercent,
	rowSpacingIn: shape.rowSpacingIn,
	seedId: optionalKey('the seed id').default(''),
	seedRateBasis: choice('the seeding rate unit', seedRateBases).default('seedsPerAcre'),
	seedRate: seedShape.seedsPerAcre.unwrap().nullable().default(null),
	nitrogenMode: choice('the N rate', nitrogenModes).default('rate'),
	nitrogenAppliedLbPerAcre: nitrogenShape.appliedLbPerAcre.unwrap().options[0].default(0),
	hasResponse: yesNo('an N response curve').default(false),
	responseInterceptBuPerAcre: responseShape.interceptBuPerAcre.nullable().default(null),
	responseLinearBuPerLbN: responseShape.linearBuPerLbN.nullable().default(null),
	responseQuadraticBuPerLbN2: responseShape.quadraticBuPerLbN2.nullable().default(null),
	nitrogenCreditToNextCropLbPerAcre: shape.nitrogenCreditToNextCropLbPerAcre,
	otherFertiliserUsdPerAcre: shape.otherFertiliserUsdPerAcre,
	chemicalsUsdPerAcre: shape.chemicalsUsdPerAcre,
	otherDirectUsdPerAcre: shape.otherDirectUsdPerAcre,
	operatingInterestMonths: shape.operatingInterestMonths,
	operationKey: z.array(optionalKey('the operation')).default([]),
	/** 0: the operation's usual month. */
	operationMonth: z
		.array(
			z
				.number()
				.int()
				.min(0, { error: 'A month is 1 (January) to 12 (December), or 0 for the usual month.' })
				.max(12, { error: 'A month is 1 (January) to 12 (December), or 0 for the usual month.' })
		)
		.default([]),
	operationPasses: z.array(stepShape.passes.unwrap()).default([]),
	hasCover: yesNo('a cover mix').default(false),
	coverSeedId: z.array(optionalKey('the cover seed id')).default([]),
	coverLbPerAcre: z.array(speciesShape.lbPerAcre.nullable()).default([]),
	coverBiomassLbDmPerAcre: coverShape.biomassLbDmPerAcre.nullable().default(null),
	coverLegumeSharePercent: coverShape.legumeSharePercent.default(0),
	coverLegumeNitrogenPercent: coverShape.legumeNitrogenPercent,
	coverNitrogenAvailablePercent: coverShape.nitrogenAvailablePercent,
	coverGrazingUtilisationPercent: coverShape.grazingUtilisationPercent,
	hasResidueGrazing: yesNo('residue grazing').default(false),
	residueLeafHuskLbDmPerUnit: residueShape.leafHuskLbDmPerUnit.unwrap().nullable().default(null),
	residueUtilisationPercent: residueShape.utilisationPercent
});
export type PracticeForm = z.output<typeof practiceFormSchema>;

/** A practice in the plan file's shape (less its id), as the API gives and takes it. */
export type PracticeValues = Omit<PracticeBody, 'key'>;

/**
 * The form's values as a practice body, and where each of the body's paths is on the form (so the
 * practice schema's messages go beside their inputs).
 */
export function practiceFromForm(form: PracticeForm): {
	body: Record<string, unknown>;
	formPath: (bodyPath: string) => string;
} {
	const steps = form.operationKey.flatMap((key, i) => (key ? [i] : []));
	const species = form.coverSeedId.flatMap((seedId, i) => (seedId ? [i] : []));
	const body = {
		name: form.name,
		crop: form.crop,
		yieldGoalPerAcre: form.yieldGoalPerAcre,
		yieldAdjustmentPercent: form.yieldAdjustmentPercent,
		rowSpacingIn: form.rowSpacingIn,
		seed: form.seedId
			? {
					seedId: form.seedId,
					...(form.seedRate === null ? {} : { [form.seedRateBasis]: form.seedRate })
				}
			: null,
		nitrogen: {
			appliedLbPerAcre:
				form.nitrogenMode === 'economic-optimum'
					? 'economic-optimum'
					: form.nitrogenAppliedLbPerAcre,
			response: form.hasResponse
				? {
						interceptBuPerAcre: form.responseInterceptBuPerAcre,
						linearBuPerLbN: form.responseLinearBuPerLbN,
						quadraticBuPerLbN2: form.responseQuadraticBuPerLbN2
					}
				: null
		},
		nitrogenCreditToNextCropLbPerAcre: form.nitrogenCreditToNextCropLbPerAcre,
		otherFertiliserUsdPerAcre: form.otherFertiliserUsdPerAcre,
		chemicalsUsdPerAcre: form.chemicalsUsdPerAcre,
		otherDirectUsdPerAcre: form.otherDirectUsdPerAcre,
		operatingInterestMonths: form.operatingInterestMonths,
		operations: steps.map((i) => ({
			operationId: form.operationKey[i],
			...(form.operationMonth[i] ? { month: form.operationMonth[i] } : {}),
			passes: form.operationPasses[i] ?? 1
		})),
		coverMix: form.hasCover
			? {
					species: species.map((i) => ({
						seedId: form.coverSeedId[i],
						lbPerAcre: form.coverLbPerAcre[i]
					})),
					biomassLbDmPerAcre: form.coverBiomassLbDmPerAcre,
					legumeSharePercent: form.coverLegumeSharePercent,
					legumeNitrogenPercent: form.coverLegumeNitrogenPercent,
					nitrogenAvailablePercent: form.coverNitrogenAvailablePercent,
					grazingUtilisationPercent: form.coverGrazingUtilisationPercent
				}
			: null,
		residueGrazing: form.hasResidueGrazing
			? {
					...(form.residueLeafHuskLbDmPerUnit === null
						? {}
						: { leafHuskLbDmPerUnit: form.residueLeafHuskLbDmPerUnit }),
					utilisationPercent: form.residueUtilisationPercent
				}
			: null
	};
	const formPath = (bodyPath: string): string => {
		const parts = bodyPath.split('.');
		const [head, second, third] = parts;
		if (head === 'operations' && third !== undefined) {
			const name =
				third === 'month'
					? 'operationMonth'
					: third === 'passes'
						? 'operationPasses'
						: 'operationKey';
			return `${name}[${steps[Number(second)]}]`;
		}
		if (head === 'coverMix' && second === 'species') {
			const row = parts[2] === undefined ? undefined : species[Number(parts[2])];
			if (row === undefined) return 'coverSeedId._errors';
			return parts[3] === 'lbPerAcre' ? `coverLbPerAcre[${row}]` : `coverSeedId[${row}]`;
		}
		return nestedFormNames.get(bodyPath) ?? nestedFormNames.get(head) ?? head;
	};
	return { body, formPath };
}

const nestedFormNames = new Map([
	['seed', 'seedRate'],
	['seed.seedId', 'seedId'],
	['seed.seedsPerAcre', 'seedRate'],
	['seed.lbPerAcre', 'seedRate'],
	['nitrogen', 'nitrogenAppliedLbPerAcre'],
	['nitrogen.appliedLbPerAcre', 'nitrogenAppliedLbPerAcre'],
	['nitrogen.response', 'hasResponse'],
	['nitrogen.response.interceptBuPerAcre', 'responseInterceptBuPerAcre'],
	['nitrogen.response.linearBuPerLbN', 'responseLinearBuPerLbN'],
	['nitrogen.response.quadraticBuPerLbN2', 'responseQuadraticBuPerLbN2'],
	['operations', 'operationKey._errors'],
	['coverMix', 'hasCover'],
	['coverMix.biomassLbDmPerAcre', 'coverBiomassLbDmPerAcre'],
	['coverMix.legumeSharePercent', 'coverLegumeSharePercent'],
	['coverMix.legumeNitrogenPercent', 'coverLegumeNitrogenPercent'],
	['coverMix.nitrogenAvailablePercent', 'coverNitrogenAvailablePercent'],
	['coverMix.grazingUtilisationPercent', 'coverGrazingUtilisationPercent'],
	['residueGrazing', 'hasResidueGrazing'],
	['residueGrazing.leafHuskLbDmPerUnit', 'residueLeafHuskLbDmPerUnit'],
	['residueGrazing.utilisationPercent', 'residueUtilisationPercent']
]);

/** A stored practice as the form shows it; `blankRows` empty rows to add operations and species. */
export function practiceFormValues(practice: PracticeValues, blankRows = 1): PracticeForm {
	const { seed, nitrogen, coverMix, residueGrazing } = practice;
	const response = nitrogen.response;
	const blank = <T>(value: T) => Array.from({ length: blankRows }, () => value);
	return {
		name: practice.name,
		crop: practice.crop,
		yieldGoalPerAcre: practice.yieldGoalPerAcre,
		yieldAdjustmentPercent: practice.yieldAdjustmentPercent,
		rowSpacingIn: practice.rowSpacingIn,
		seedId: seed?.seedId ?? '',
		seedRateBasis: seed?.lbPerAcre !== undefined ? 'lbPerAcre' : 'seedsPerAcre',
		seedRate: seed?.seedsPerAcre ?? seed?.lbPerAcre ?? null,
		nitrogenMode: nitrogen.appliedLbPerAcre === 'economic-optimum' ? 'economic-optimum' : 'rate',
		nitrogenAppliedLbPerAcre:
			nitrogen.appliedLbPerAcre === 'economic-optimum' ? 0 : nitrogen.appliedLbPerAcre,
		hasResponse: response !== null,
		responseInterceptBuPerAcre: response?.interceptBuPerAcre ?? null,
		responseLinearBuPerLbN: response?.linearBuPerLbN ?? null,
		responseQuadraticBuPerLbN2: response?.quadraticBuPerLbN2 ?? null,
		nitrogenCreditToNextCropLbPerAcre: practice.nitrogenCreditToNextCropLbPerAcre,
		otherFertiliserUsdPerAcre: practice.otherFertiliserUsdPerAcre,
		chemicalsUsdPerAcre: practice.chemicalsUsdPerAcre,
		otherDirectUsdPerAcre: practice.otherDirectUsdPerAcre,
		operatingInterestMonths: practice.operatingInterestMonths,
		operationKey: [...practice.operations.map((step) => step.operationId), ...blank('')],
		operationMonth: [...practice.operations.map((step) => step.month ?? 0), ...blank(0)],
		operationPasses: [...practice.operations.map((step) => step.passes), ...blank(1)],
		hasCover: coverMix !== null,
		coverSeedId: [...(coverMix?.species ?? []).map((s) => s.seedId), ...blank('')],
		coverLbPerAcre: [...(coverMix?.species ?? []).map((s) => s.lbPerAcre), ...blank(null)],
		coverBiomassLbDmPerAcre: coverMix?.biomassLbDmPerAcre ?? null,
		coverLegumeSharePercent: coverMix?.legumeSharePercent ?? 0,
		coverLegumeNitrogenPercent:
			coverMix?.legumeNitrogenPercent ?? coverShape.legumeNitrogenPercent.parse(undefined),
		coverNitrogenAvailablePercent:
			coverMix?.nitrogenAvailablePercent ?? coverShape.nitrogenAvailablePercent.parse(undefined),
		coverGrazingUtilisationPercent: coverMix?.grazingUtilisationPercent ?? 0,
		hasResidueGrazing: residueGrazing !== null,
		residueLeafHuskLbDmPerUnit: residueGrazing?.leafHuskLbDmPerUnit ?? null,
		residueUtilisationPercent:
			residueGrazing?.utilisationPercent ?? residueShape.utilisationPercent.parse(undefined)
	};
}

/** The rotation form: a name and one practice a year; empty years are left out. */
export const rotationFormSchema = z.object({
	name: rotationSchema.shape.name,
	practice: z.array(optionalKey('the practice')).max(maxRotationYears).default([])
});
export type RotationForm = z.output<typeof rotationFormSchema>;
