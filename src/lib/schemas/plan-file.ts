import { z } from 'zod';
import { farmSchema } from './farm';
import { toFieldIssues, type FieldIssue } from './issues';

/**
 * The plan document: one JSON file holding a farm, its fields, herd, field operations, crop practices,
 * rotations, price sets by year and one plan. Quantities are US customary (acres, lb, bu, gal, ft, mph);
 * `farm.unitSystem` only chooses how the app shows them. Every default the engine relies on is written
 * here with `.default()`, so a parsed document states every input the engine uses.
 */

const idSchema = z
	.string()
	.regex(/^[a-z0-9][a-z0-9-]*$/, 'Use lower-case letters, digits and hyphens (e.g. "north-flat")');
const nameSchema = z.string().trim().min(1, 'Required');
const monthSchema = z
	.number()
	.int()
	.min(1, 'Month is 1 (Jan) to 12 (Dec)')
	.max(12, 'Month is 1 (Jan) to 12 (Dec)');
const percentSchema = z.number().min(0, 'At least 0 %').max(100, 'At most 100 %');
const nonNegative = z.number().min(0, 'Cannot be negative');
const positive = z.number().positive('Must be more than 0');
const yearSchema = z.number().int().min(1900).max(2200);

/** Crops the engine prices and converts; grains are sold by the bushel, forages by the ton (2,000 lb, as fed). */
export const cropSchema = z.enum([
	'corn',
	'soybean',
	'wheat',
	'oats',
	'barley',
	'rye',
	'oat-pea-forage',
	'hay'
]);

// The farm part is the same shape the farm settings form and API take: one schema for both.
export { farmSchema };

export const fieldSchema = z.strictObject({
	id: idSchema,
	name: nameSchema,
	acres: positive,
	productivityIndex: z
		.number()
		.min(0.1)
		.max(3)
		.default(1)
		.describe("1.00 = the farm's average field; scales the yield goal."),
	priorCrop: z.string().default(''),
	priorCropNitrogenCreditLbPerAcre: nonNegative
		.default(0)
		.describe("N credit the crop grown before the plan's first year leaves for that year."),
	notes: z.string().default('')
});

export const herdSchema = z.strictObject({
	head: z.number().int().min(0),
	averageWeightLb: positive,
	// Society for Range Management (1998) glossary: one animal unit eats about 26 lb forage DM a day.
	intakeLbDmPerAuDay: positive.default(26),
	feedingSeasonStartMonth: monthSchema,
	feedingSeasonDays: z.number().int().min(0).max(366),
	maxGrazingDays: z
		.number()
		.int()
		.min(0)
		.max(366)
		.nullable()
		.default(null)
		.describe(
			'Days the herd can graze before snow or mud stops it; null: the whole feeding season.'
		),
	baleWeightLb: positive,
	// UNL and UF/IFAS examples use hay at 88 % dry matter.
	baleDryMatterPercent: percentSchema.gt(0, 'Must be more than 0 %').default(88),
	feedingWastePercent: percentSchema,
	choreHoursPerDayFeedingHay: nonNegative,
	choreHoursPerDayGrazing: nonNegative,
	// ASABE D384.2 Table 1.b, beef cow about 0.42 lb N excreted per day (from memory).
	manureNitrogenLbPerAuDay: nonNegative.default(0.42),
	// Andersen et al. (2020), NDSU: no measurable N carry-over to the next crop after fall grazing a cover.
	manureNitrogenAvailablePercent: percentSchema.default(0)
});

const dieselPerAcreSchema = z.strictObject({
	basis: z.literal('per-acre'),
	dieselGallonsPerAcre: nonNegative
});
const dieselFromPtoSchema = z.strictObject({
	basis: z.literal('pto-power'),
	tractorMaxPtoHp: positive,
	// ISU Ag Decision Maker A3-29 (from ASAE D497): year-round average diesel use 0.044 gal/h per max PTO hp.
	dieselGallonsPerHpHour: positive.default(0.044)
});

const ownOperationSchema = z.strictObject({
	id: idSchema,
	name: nameSchema,
	by: z.literal('own'),
	month: monthSchema,
	speedMph: positive,
	widthFt: positive,
	fieldEfficiencyPercent: z.number().gt(0, 'Must be more than 0 %').max(100, 'At most 100 %'),
	fuel: z.discriminatedUnion('basis', [dieselPerAcreSchema, dieselFromPtoSchema]),
	// farmdoc (Univ. of Illinois) machinery cost tables: labour hours = 1.1 × machine hours.
	labourFactor: z.number().min(1).max(3).default(1.1),
	repairsUsdPerAcre: nonNegative
});

const customOperationSchema = z.strictObject({
	id: idSchema,
	name: nameSchema,
	by: z
		.literal('custom')
		.describe(
			"Hired out: costs the year's custom rate per acre, no own machine hours, labour or diesel."
		),
	month: monthSchema
});

export const fieldOperationSchema = z.discriminatedUnion('by', [
	ownOperationSchema,
	customOperationSchema
]);

const seedingSchema = z.strictObject({
	seedId: idSchema,
	seedsPerAcre: positive.optional(),
	lbPerAcre: positive.optional()
});

const nitrogenResponseSchema = z
	.strictObject({
		interceptBuPerAcre: nonNegative.describe('a in Y = a + bN − cN², bu/ac'),
		linearBuPerLbN: positive.describe('b, bu per lb N'),
		quadraticBuPerLbN2: positive.describe('c, bu per (lb N)²')
	})
	.describe(
		'Yield Y = a + bN − cN² bu/ac to available N (applied + credits), flat above N = b/(2c).'
	);

const coverMixSchema = z.strictObject({
	species: z.array(z.strictObject({ seedId: idSchema, lbPerAcre: positive })).min(1),
	biomassLbDmPerAcre: nonNegative,
	legumeSharePercent: percentSchema.describe(
		"Share of the cover's dry matter that is legume: only legume N is new N for the next crop."
	),
	// SARE Managing Cover Crops Profitably: annual legumes hold 3-3.5 % N at flowering.
	legumeNitrogenPercent: percentSchema.default(3.5),
	// SARE Managing Cover Crops Profitably: about half of legume N is available in the first season.
	nitrogenAvailablePercent: percentSchema.default(50),
	grazingUtilisationPercent: percentSchema
		.default(0)
		.describe('Share of the cover eaten by grazing cattle; 0 when the cover is not grazed.')
});

const residueGrazingSchema = z.strictObject({
	// UNL (Rasby 2007; CropWatch): 16 lb leaf and husk DM per bushel of corn grain.
	leafHuskLbDmPerBu: nonNegative.default(16),
	// UNL (Rasby 2007): cattle eat about 50 % of the leaf and husk.
	utilisationPercent: percentSchema.default(50)
});

export const cropPracticeSchema = z.strictObject({
	id: idSchema,
	name: nameSchema,
	crop: cropSchema,
	yieldGoalPerAcre: nonNegative.describe(
		'bu/ac for grains, tons/ac (as fed) for forages, before productivity and N response.'
	),
	yieldAdjustmentPercent: z
		.number()
		.min(-100)
		.max(100)
		.default(0)
		.describe(
			'A stated change to yield for the practice itself, e.g. wide rows; negative for a loss.'
		),
	rowSpacingIn: positive.nullable().default(null),
	seed: seedingSchema.nullable().default(null),
	nitrogen: z
		.strictObject({
			appliedLbPerAcre: z
				.union([nonNegative, z.literal('economic-optimum')])
				.default(0)
				.describe(
					"lb N/ac bought and applied, or 'economic-optimum' to buy up to the EONR less credits."
				),
			response: nitrogenResponseSchema.nullable().default(null)
		})
		.prefault({}),
	nitrogenCreditToNextCropLbPerAcre: nonNegative.default(0),
	otherFertiliserUsdPerAcre: nonNegative,
	chemicalsUsdPerAcre: nonNegative,
	otherDirectUsdPerAcre: nonNegative
		.default(0)
		.describe('Drying, hauling, crop insurance and other direct costs per acre.'),
	// Common practice, no published source: operating money is carried about six months, planting to harvest.
	operatingInterestMonths: z.number().min(0).max(24).default(6),
	operations: z
		.array(
			z.strictObject({
				operationId: idSchema,
				month: monthSchema
					.optional()
					.describe("Overrides the operation's usual month for this practice."),
				passes: z.number().int().min(1).default(1)
			})
		)
		.default([]),
	coverMix: coverMixSchema.nullable().default(null),
	residueGrazing: residueGrazingSchema.nullable().default(null)
});

export const rotationSchema = z.strictObject({
	id: idSchema,
	name: nameSchema,
	practices: z
		.array(idSchema)
		.min(1, 'A rotation needs at least one practice')
		.describe('Practice ids, one per year, in order.')
});

const seedPriceSchema = z.strictObject({
	usdPerThousandSeeds: nonNegative.optional(),
	usdPerLb: nonNegative.optional()
});

export const priceSetSchema = z.strictObject({
	year: yearSchema,
	cropPricesUsdPerUnit: z
		.partialRecord(cropSchema, nonNegative)
		.describe('$/bu for grains, $/ton for forages.'),
	nitrogenUsdPerLb: nonNegative,
	dieselUsdPerGallon: nonNegative,
	labourUsdPerHour: nonNegative,
	hayUsdPerBale: nonNegative,
	seedPrices: z.record(idSchema, seedPriceSchema).default({}),
	customRatesUsdPerAcre: z.record(idSchema, nonNegative).default({})
});

export const planSchema = z.strictObject({
	name: nameSchema,
	horizon: z.strictObject({
		startYear: yearSchema,
		years: z.number().int().min(1).max(30)
	}),
	fieldRotations: z.array(
		z.strictObject({
			fieldId: idSchema,
			rotationId: idSchema,
			startingPhase: z
				.number()
				.int()
				.min(1)
				.default(1)
				.describe("1 = the rotation's first practice in the first plan year.")
		})
	),
	assumptions: z
		.array(z.string())
		.default([])
		.describe('Plain statements shown with the results (what the plan takes for granted).')
});

const planDocumentShape = z.strictObject({
	formatVersion: z.literal(1),
	notes: z.string().default(''),
	farm: farmSchema,
	fields: z.array(fieldSchema).min(1, 'A farm needs at least one field'),
	herd: herdSchema.nullable().default(null),
	operations: z.array(fieldOperationSchema).default([]),
	practices: z.array(cropPracticeSchema).min(1),
	rotations: z.array(rotationSchema).min(1),
	priceSets: z.array(priceSetSchema).min(1),
	plan: planSchema
});

type Shape = z.output<typeof planDocumentShape>;
type Path = (string | number)[];

/** Refuses cross-references the shape alone cannot: unknown ids, duplicates, phases, missing prices. */
function checkReferences(doc: Shape, ctx: z.RefinementCtx) {
	const refuse = (path: Path, message: string) => ctx.addIssue({ code: 'custom', path, message });
	const uniqueIds = (items: { id: string }[], path: string) => {
		const seen = new Set<string>();
		items.forEach((item, i) => {
			if (seen.has(item.id)) refuse([path, i, 'id'], `Duplicate id "${item.id}"`);
			seen.add(item.id);
		});
		return seen;
	};
	const fieldIds = uniqueIds(doc.fields, 'fields');
	const operationIds = uniqueIds(doc.operations, 'operations');
	const practiceIds = uniqueIds(doc.practices, 'practices');
	const rotationIds = uniqueIds(doc.rotations, 'rotations');
	const practiceById = new Map(doc.practices.map((p) => [p.id, p]));
	const customOperationIds = doc.operations.filter((o) => o.by === 'custom').map((o) => o.id);

	const seedsRated = new Set<string>();
	const lbRated = new Set<string>();
	doc.practices.forEach((practice, i) => {
		if (practice.seed) {
			const { seedsPerAcre, lbPerAcre, seedId } = practice.seed;
			if ((seedsPerAcre === undefined) === (lbPerAcre === undefined)) {
				refuse(['practices', i, 'seed'], 'Give either seedsPerAcre or lbPerAcre');
			}
			(seedsPerAcre === undefined ? lbRated : seedsRated).add(seedId);
		}
		practice.coverMix?.species.forEach((s) => lbRated.add(s.seedId));
		practice.operations.forEach((step, j) => {
			if (!operationIds.has(step.operationId)) {
				refuse(
					['practices', i, 'operations', j, 'operationId'],
					`Unknown operation "${step.operationId}"`
				);
			}
		});
		if (practice.nitrogen.appliedLbPerAcre === 'economic-optimum' && !practice.nitrogen.response) {
			refuse(
				['practices', i, 'nitrogen', 'appliedLbPerAcre'],
				'An economic-optimum rate needs a nitrogen response curve'
			);
		}
		if (practice.nitrogen.response && !isGrain(practice.crop)) {
			refuse(
				['practices', i, 'nitrogen', 'response'],
				'N response curves are in bu/ac: grains only'
			);
		}
		if (practice.residueGrazing && !isGrain(practice.crop)) {
			refuse(
				['practices', i, 'residueGrazing'],
				'Residue grazing is figured per bushel: grains only'
			);
		}
	});

	doc.rotations.forEach((rotation, i) => {
		rotation.practices.forEach((id, j) => {
			if (!practiceIds.has(id))
				refuse(['rotations', i, 'practices', j], `Unknown practice "${id}"`);
		});
	});

	const assigned = new Set<string>();
	doc.plan.fieldRotations.forEach((assignment, i) => {
		const path: Path = ['plan', 'fieldRotations', i];
		if (!fieldIds.has(assignment.fieldId)) {
			refuse([...path, 'fieldId'], `Unknown field "${assignment.fieldId}"`);
		}
		if (assigned.has(assignment.fieldId)) {
			refuse([...path, 'fieldId'], `Field "${assignment.fieldId}" already has a rotation`);
		}
		assigned.add(assignment.fieldId);
		const rotation = doc.rotations.find((r) => r.id === assignment.rotationId);
		if (!rotation) {
			refuse([...path, 'rotationId'], `Unknown rotation "${assignment.rotationId}"`);
		} else if (assignment.startingPhase > rotation.practices.length) {
			refuse(
				[...path, 'startingPhase'],
				`Rotation "${rotation.id}" has ${rotation.practices.length} phase(s); starting phase ${assignment.startingPhase} is out of range`
			);
		}
	});
	doc.fields.forEach((field, i) => {
		if (!assigned.has(field.id))
			refuse(['fields', i, 'id'], `Field "${field.id}" has no rotation in the plan`);
	});
	if (!rotationIds.size) refuse(['rotations'], 'At least one rotation is needed');

	const usedPracticeIds = new Set(
		doc.plan.fieldRotations.flatMap(
			(a) => doc.rotations.find((r) => r.id === a.rotationId)?.practices ?? []
		)
	);
	const priceSetIndexByYear = new Map<number, number>();
	doc.priceSets.forEach((set, i) => {
		if (priceSetIndexByYear.has(set.year))
			refuse(['priceSets', i, 'year'], `Duplicate price set for ${set.year}`);
		priceSetIndexByYear.set(set.year, i);
		for (const id of usedPracticeIds) {
			const practice = practiceById.get(id);
			const crop = practice?.crop;
			if (crop && set.cropPricesUsdPerUnit[crop] === undefined) {
				refuse(
					['priceSets', i, 'cropPricesUsdPerUnit', crop],
					`No price for ${crop} (practice "${id}")`
				);
			} else if (crop && practice.nitrogen.response && set.cropPricesUsdPerUnit[crop] === 0) {
				// The N price ratio ($/lb N ÷ $/bu) has no meaning at a grain price of zero.
				refuse(
					['priceSets', i, 'cropPricesUsdPerUnit', crop],
					`A ${crop} price above 0 is needed for the N response of practice "${id}"`
				);
			}
		}
		for (const seedId of seedsRated) {
			if (set.seedPrices[seedId]?.usdPerThousandSeeds === undefined) {
				refuse(
					['priceSets', i, 'seedPrices', seedId, 'usdPerThousandSeeds'],
					`No price per 1,000 seeds for "${seedId}"`
				);
			}
		}
		for (const seedId of lbRated) {
			if (set.seedPrices[seedId]?.usdPerLb === undefined) {
				refuse(
					['priceSets', i, 'seedPrices', seedId, 'usdPerLb'],
					`No price per lb for "${seedId}"`
				);
			}
		}
		for (const operationId of customOperationIds) {
			if (set.customRatesUsdPerAcre[operationId] === undefined) {
				refuse(
					['priceSets', i, 'customRatesUsdPerAcre', operationId],
					`No custom rate for "${operationId}"`
				);
			}
		}
	});
	const { startYear, years } = doc.plan.horizon;
	for (let year = startYear; year < startYear + years; year++) {
		if (!priceSetIndexByYear.has(year)) refuse(['priceSets'], `No price set for plan year ${year}`);
	}
}

export const planDocumentSchema = planDocumentShape.superRefine(checkReferences);

export type PlanDocument = z.output<typeof planDocumentSchema>;
export type PlanDocumentInput = z.input<typeof planDocumentSchema>;
export type Crop = z.output<typeof cropSchema>;
export type FieldOperation = PlanDocument['operations'][number];
export type CropPractice = PlanDocument['practices'][number];
export type PriceSet = PlanDocument['priceSets'][number];
export type Herd = NonNullable<PlanDocument['herd']>;

export const grainCrops = ['corn', 'soybean', 'wheat', 'oats', 'barley', 'rye'] as const;
export type GrainCrop = (typeof grainCrops)[number];

export function isGrain(crop: Crop): crop is GrainCrop {
	return (grainCrops as readonly string[]).includes(crop);
}

export type ParsePlanResult =
	{ ok: true; plan: PlanDocument } | { ok: false; issues: FieldIssue[] };

export function parsePlanDocument(input: unknown): ParsePlanResult {
	const result = planDocumentSchema.safeParse(input);
	return result.success
		? { ok: true, plan: result.data }
		: { ok: false, issues: toFieldIssues(result.error) };
}
