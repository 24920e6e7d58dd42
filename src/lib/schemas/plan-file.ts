import { z } from 'zod';
import { cropSchema, cropsWithBuiltIns, type CropDefinition } from './crops';
import { farmSchema } from './farm';
import { toFieldIssues, type FieldIssue } from './issues';
import { isFamilyLabour, personRoles, tenures } from '../farm-lists';
import { amount, choice, id, list, month, percent, text } from './messages';
import { upgradeFormat1 } from './plan-file-format-1';

/**
 * The plan document, format 2: one JSON file holding a farm, its crops, fields, herd, field operations,
 * crop practices, rotations, price sets by year and one plan. Quantities are US customary (acres, lb,
 * bu, gal, ft, mph); `farm.unitSystem` only chooses how the app shows them. Every default the engine
 * relies on is written here with `.default()`, so a parsed document states every input the engine uses.
 * Ranges are plausible bounds a farm's numbers stay inside: they catch slips (a missed decimal point)
 * and keep every result a finite number. They are common practice, no published source, unless a
 * source is named beside one.
 */

export const currentFormatVersion = 2;

const name = (label: string) => text(label, { max: 120, required: true });
const notes = (label: string) => text(label, { max: 4000 }).default('');
export const yearSchema = amount('the year', { min: 1950, max: 2200, integer: true });
const usdPerAcre = (label: string) => amount(label, { min: 0, max: 5000, usdPer: 'acre' });

// The farm part is the same shape the farm settings form and API take: one schema for both.
export { farmSchema };

export const fieldSchema = z.strictObject({
	id: id('the field id'),
	name: name('the field name'),
	// A hundredth of an acre is a garden plot; per-acre results divide by it.
	acres: amount('field area', { min: 0.01, max: 20_000, unit: 'acres' }),
	productivityIndex: amount('the productivity index', { min: 0.1, max: 3 })
		.default(1)
		.describe("1.00 = the farm's average field; scales the yield goal."),
	priorCrop: text('the prior crop', { max: 120 }).default(''),
	priorCropNitrogenCreditLbPerAcre: amount('the prior crop N credit', {
		min: 0,
		max: 300,
		unit: 'lb N per acre'
	})
		.default(0)
		.describe("N credit the crop grown before the plan's first year leaves for that year."),
	tenure: choice('the tenure', tenures).default('owned'),
	// Iowa State's cash rent survey puts most county averages at $150–350 an acre (from memory); 2,000
	// bounds a slip such as 2500 typed for 250.0.
	cashRentUsdPerAcre: amount('the cash rent', { min: 0, max: 2000, usdPer: 'acre a year' })
		.default(0)
		.describe("Cash rent a year: the field's land cost in the budgets. 0 for owned land."),
	notes: notes('field notes')
});

/** Why a field's rent does not fit its tenure, or null when it does (the file and the API both ask). */
export function cashRentMessage(
	field: Pick<z.output<typeof fieldSchema>, 'tenure' | 'cashRentUsdPerAcre'>
) {
	return field.tenure === 'owned' && field.cashRentUsdPerAcre > 0
		? 'An owned field pays no cash rent: set the tenure to cash-rented or the rent to 0.'
		: null;
}

/** Someone who works on the farm; the farm's labour hours are the operator's, partners' and family's. */
export const personSchema = z.strictObject({
	id: id('the person id'),
	name: name('the name'),
	role: choice('the role', personRoles),
	hoursAvailableByMonth: list(
		'hours for each month',
		// 31 days × 24 h: more than that is a typing slip.
		amount('hours in a month', { min: 0, max: 744, unit: 'hours' }),
		{ max: 12 }
	)
		.length(12, { error: 'Give hours for all 12 months, January to December.' })
		.describe('Hours free for farm work each month, January to December (less any off-farm job).'),
	wageUsdPerHour: amount('the wage', { min: 0, max: 500, usdPer: 'hour' })
		.nullable()
		.default(null)
		.describe('Hired help only: what an hour costs.'),
	notes: notes('notes')
});

/** Why a person's wage does not fit their role, or null when it does (the file and the API both ask). */
export function wageMessage(
	person: Pick<z.output<typeof personSchema>, 'name' | 'role' | 'wageUsdPerHour'>
) {
	if (person.role === 'hired' && person.wageUsdPerHour === null) {
		return `Give ${person.name}'s wage: hired help is paid by the hour.`;
	}
	if (person.role !== 'hired' && person.wageUsdPerHour !== null) {
		return 'Only hired help has a wage; leave it empty.';
	}
	return null;
}

const choreHours = (label: string) => amount(label, { min: 0, max: 24, unit: 'hours a day' });

export const herdSchema = z.strictObject({
	head: amount('the number of head', { min: 0, max: 20_000, integer: true }),
	averageWeightLb: amount('the average live weight', { min: 100, max: 3000, unit: 'lb' }),
	// Society for Range Management (1998) glossary: one animal unit eats about 26 lb forage DM a day.
	intakeLbDmPerAuDay: amount('the daily intake', {
		min: 5,
		max: 60,
		unit: 'lb dry matter per animal unit'
	}).default(26),
	feedingSeasonStartMonth: month('the month the feeding season starts'),
	feedingSeasonDays: amount('the feeding season', {
		min: 0,
		max: 366,
		integer: true,
		unit: 'days'
	}),
	maxGrazingDays: amount('the grazing days', { min: 0, max: 366, integer: true, unit: 'days' })
		.nullable()
		.default(null)
		.describe(
			'Days the herd can graze before snow or mud stops it; null: the whole feeding season.'
		),
	// Round bales weigh about 700–1,500 lb (REFERENCE-VALUES §5d); small squares from about 40 lb.
	baleWeightLb: amount('the bale weight', { min: 20, max: 3000, unit: 'lb' }),
	// UNL and UF/IFAS examples use hay at 88 % dry matter; baleage is down to about 40 %.
	baleDryMatterPercent: percent('the bale dry matter', { min: 20 }).default(88),
	// Hay feeding waste is the share of the hay put out that cattle do not eat (Oklahoma State, Lalman):
	// 3.5–21 % with feeders, 45 % with free access (Bell & Martz 1973); 60 % bounds a slip.
	feedingWastePercent: percent('feeding waste', { max: 60 }).describe(
		'Share of the hay put out that is trampled or spoiled, not eaten: hay bought = hay eaten ÷ (1 − waste).'
	),
	choreHoursPerDayFeedingHay: choreHours('chore hours while feeding hay'),
	choreHoursPerDayGrazing: choreHours('chore hours while grazing'),
	// ASABE D384.2 Table 1.b, beef cow about 0.42 lb N excreted per day (from memory).
	manureNitrogenLbPerAuDay: amount('manure N', {
		min: 0,
		max: 2,
		unit: 'lb N per animal unit a day'
	}).default(0.42),
	// Andersen et al. (2020), NDSU: no measurable N carry-over to the next crop after fall grazing a cover.
	manureNitrogenAvailablePercent: percent('manure N available to the next crop').default(0)
});

const dieselPerAcreSchema = z.strictObject({
	basis: z.literal('per-acre'),
	// Univ. of Missouri G1208: moldboard plowing, the heaviest common pass, is 1.68 gal/ac; 20 bounds a slip.
	dieselGallonsPerAcre: amount('diesel per acre', { min: 0, max: 20, unit: 'gal' })
});
const dieselFromPtoSchema = z.strictObject({
	basis: z.literal('pto-power'),
	tractorMaxPtoHp: amount('the tractor PTO power', { min: 10, max: 1000, unit: 'hp' }),
	// ISU Ag Decision Maker A3-29 (from ASAE D497): year-round average diesel use 0.044 gal/h per max PTO hp.
	dieselGallonsPerHpHour: amount('diesel per hp-hour', {
		min: 0.01,
		max: 0.2,
		unit: 'gal'
	}).default(0.044)
});

const operationCommon = {
	id: id('the operation id'),
	name: name('the operation name'),
	month: month("the operation's month")
};
const repairs = usdPerAcre('repairs');

/** Own machine stated by what it is: hours follow from field capacity (ASABE D497). */
const ownMachineSchema = z.strictObject({
	...operationCommon,
	by: z.literal('own'),
	statedAs: z
		.literal('machine')
		.describe('Speed, width and field efficiency give the field capacity and machine hours.'),
	speedMph: amount('the speed', { min: 0.5, max: 30, unit: 'mph' }),
	widthFt: amount('the working width', { min: 1, max: 200, unit: 'ft' }),
	fieldEfficiencyPercent: percent('the field efficiency', { min: 10 }),
	fuel: z.discriminatedUnion('basis', [dieselPerAcreSchema, dieselFromPtoSchema]),
	// farmdoc (Univ. of Illinois) machinery cost tables: labour hours = 1.1 × machine hours.
	labourFactor: amount('the labour factor', { min: 1, max: 3 }).default(1.1),
	repairsUsdPerAcre: repairs
});

/** Own machine stated by published per-acre rates (fuel and labour tables): nothing is derived. */
const ownPerAcreSchema = z.strictObject({
	...operationCommon,
	by: z.literal('own'),
	statedAs: z
		.literal('per-acre')
		.describe('Diesel, machine hours and labour hours per acre as published; nothing derived.'),
	dieselGallonsPerAcre: amount('diesel per acre', { min: 0, max: 20, unit: 'gal' }),
	machineHoursPerAcre: amount('machine hours per acre', { min: 0, max: 10, unit: 'hours' }),
	labourHoursPerAcre: amount('labour hours per acre', { min: 0, max: 20, unit: 'hours' }),
	repairsUsdPerAcre: repairs.default(0)
});

const customOperationSchema = z.strictObject({
	...operationCommon,
	by: z
		.literal('custom')
		.describe(
			"Hired out: costs the year's custom rate per acre, no own machine hours, labour or diesel."
		)
});

export const fieldOperationSchema = z.discriminatedUnion('by', [
	z.discriminatedUnion('statedAs', [ownMachineSchema, ownPerAcreSchema]),
	customOperationSchema
]);

const seedingSchema = z.strictObject({
	seedId: id('the seed id'),
	// Corn about 34,000 and soybean 140,000 seeds/ac; small grains 1–1.5 million (common practice, no published source).
	seedsPerAcre: amount('seeds per acre', { above: 0, max: 5_000_000 }).optional(),
	lbPerAcre: amount('seed per acre', { above: 0, max: 500, unit: 'lb' }).optional()
});

// Published quadratic-plateau curves flatten between about 100 and 250 lb N/ac (ISU, Cerrato & Blackmer);
// a join point above 500 lb N/ac is a slip, and the bound keeps the plateau yield finite.
export const maxPlateauJoinLbN = 500;

const nitrogenResponseSchema = z
	.strictObject({
		interceptBuPerAcre: amount('the curve intercept a', {
			min: 0,
			max: 400,
			unit: 'bu/ac'
		}).describe('a in Y = a + bN − cN², bu/ac'),
		linearBuPerLbN: amount('the curve slope b', {
			min: 0.01,
			max: 5,
			unit: 'bu per lb N'
		}).describe('b, bu per lb N'),
		quadraticBuPerLbN2: amount('the curve term c', {
			above: 0,
			max: 0.1,
			unit: 'bu per (lb N)²'
		}).describe('c, bu per (lb N)²')
	})
	.refine((r) => r.linearBuPerLbN / (2 * r.quadraticBuPerLbN2) <= maxPlateauJoinLbN, {
		error: `The curve must level off by ${maxPlateauJoinLbN} lb N/ac: b ÷ 2c is larger (raise c or lower b).`,
		path: ['quadraticBuPerLbN2']
	})
	.describe(
		'Yield Y = a + bN − cN² bu/ac to available N (applied + credits), flat above N = b/(2c).'
	);

const coverMixSchema = z.strictObject({
	species: list(
		'cover species',
		z.strictObject({
			seedId: id('the seed id'),
			lbPerAcre: amount('cover seed per acre', { above: 0, max: 500, unit: 'lb' })
		}),
		{ min: 1, max: 20 }
	),
	// Cover biomass in the Corn Belt runs to a few thousand lb DM/ac (REFERENCE-VALUES §7).
	biomassLbDmPerAcre: amount('cover biomass', {
		min: 0,
		max: 20_000,
		unit: 'lb dry matter per acre'
	}),
	legumeSharePercent: percent('the legume share').describe(
		"Share of the cover's dry matter that is legume: only legume N is new N for the next crop."
	),
	// SARE Managing Cover Crops Profitably: annual legumes hold 3-3.5 % N at flowering.
	legumeNitrogenPercent: percent('legume N', { max: 10 }).default(3.5),
	// SARE Managing Cover Crops Profitably: about half of legume N is available in the first season.
	nitrogenAvailablePercent: percent('N available to the next crop').default(50),
	grazingUtilisationPercent: percent('cover grazing utilisation')
		.default(0)
		.describe('Share of the cover eaten by grazing cattle; 0 when the cover is not grazed.')
});

const residueGrazingSchema = z.strictObject({
	leafHuskLbDmPerUnit: amount('the grazable residue per sale unit', {
		min: 0,
		max: 100,
		unit: 'lb dry matter'
	})
		.optional()
		.describe("Leaf and husk DM per unit of grain; left out: the crop's own figure."),
	// UNL (Rasby 2007): cattle eat about 50 % of the leaf and husk.
	utilisationPercent: percent('residue utilisation').default(50)
});

export const cropPracticeSchema = z.strictObject({
	id: id('the practice id'),
	name: name('the practice name'),
	crop: id('the crop'),
	yieldGoalPerAcre: amount('the yield goal', {
		min: 0,
		max: 100_000,
		unit: 'sale units per acre'
	}).describe(
		"Per acre in the crop's sale unit (bu, cwt, ton as fed, lb), before productivity and N response."
	),
	yieldAdjustmentPercent: amount('the yield adjustment', { min: -100, max: 100, unit: '%' })
		.default(0)
		.describe(
			'A stated change to yield for the practice itself, e.g. wide rows; negative for a loss.'
		),
	rowSpacingIn: amount('the row spacing', { min: 1, max: 120, unit: 'inches' })
		.nullable()
		.default(null),
	seed: seedingSchema.nullable().default(null),
	nitrogen: z
		.strictObject({
			appliedLbPerAcre: z
				.union([
					amount('N applied', { min: 0, max: 500, unit: 'lb N per acre' }),
					z.literal('economic-optimum')
				])
				.default(0)
				.describe(
					"lb N/ac bought and applied, or 'economic-optimum' to buy up to the EONR less credits."
				),
			response: nitrogenResponseSchema.nullable().default(null)
		})
		.prefault({}),
	nitrogenCreditToNextCropLbPerAcre: amount('the N credit to the next crop', {
		min: 0,
		max: 300,
		unit: 'lb N per acre'
	}).default(0),
	otherFertiliserUsdPerAcre: usdPerAcre('other fertiliser'),
	chemicalsUsdPerAcre: usdPerAcre('chemicals'),
	otherDirectUsdPerAcre: usdPerAcre('other direct costs')
		.default(0)
		.describe('Drying, hauling, crop insurance and other direct costs per acre.'),
	// Common practice, no published source: operating money is carried about six months, planting to harvest.
	operatingInterestMonths: amount('the months operating money is carried', {
		min: 0,
		max: 24,
		unit: 'months'
	}).default(6),
	operations: list(
		'operations',
		z.strictObject({
			operationId: id('the operation id'),
			month: month("the operation's month")
				.optional()
				.describe("Overrides the operation's usual month for this practice."),
			passes: amount('passes', { min: 1, max: 10, integer: true }).default(1)
		}),
		{ max: 50 }
	).default([]),
	coverMix: coverMixSchema.nullable().default(null),
	residueGrazing: residueGrazingSchema.nullable().default(null)
});

export const rotationSchema = z.strictObject({
	id: id('the rotation id'),
	name: name('the rotation name'),
	practices: list('practices', id('the practice id'), { min: 1, max: 30 }).describe(
		'Practice ids, one per year, in order.'
	)
});

const seedPriceSchema = z.strictObject({
	usdPerThousandSeeds: amount('the seed price', {
		min: 0,
		max: 100,
		usdPer: '1,000 seeds'
	}).optional(),
	usdPerLb: amount('the seed price', { min: 0, max: 500, usdPer: 'lb' }).optional()
});

const cropPriceSchema = amount('the crop price', { min: 0, max: 10_000, usdPer: 'sale unit' });

export const priceSetSchema = z.strictObject({
	year: yearSchema,
	cropPricesUsdPerUnit: z
		.record(id('the crop'), cropPriceSchema)
		.describe("$ per the crop's sale unit: per bu, cwt, ton or lb."),
	nitrogenUsdPerLb: amount('the N price', { min: 0, max: 20, usdPer: 'lb N' }),
	dieselUsdPerGallon: amount('the diesel price', { min: 0, max: 50, usdPer: 'gallon' }),
	labourUsdPerHour: amount('the labour rate', { min: 0, max: 500, usdPer: 'hour' }),
	hayUsdPerBale: amount('the hay price', { min: 0, max: 2000, usdPer: 'bale' }),
	seedPrices: z.record(id('the seed id'), seedPriceSchema).default({}),
	customRatesUsdPerAcre: z
		.record(
			id('the operation id'),
			amount('the custom rate', { min: 0, max: 2000, usdPer: 'acre' })
		)
		.default({})
});

/**
 * What a plan tries on top of its practices: lower N, a yield it expects (test years, not agronomy).
 * The bounds catch slips, not agronomy: ±300 lb N/ac spans any corn rate and −90…+100 % any yield year
 * (common practice, no published source).
 */
export const planAdjustmentSchema = z.strictObject({
	practiceId: id('the practice id')
		.optional()
		.describe('Only this practice (any field, unless fieldId).'),
	fieldId: id('the field id')
		.optional()
		.describe('Only this field (any practice, unless practiceId).'),
	nitrogenChangeLbPerAcre: amount('the N rate change', {
		min: -300,
		max: 300,
		unit: 'lb N per acre'
	})
		.default(0)
		.describe('Added to the N the practice applies (never below 0); negative for less N.'),
	yieldChangePercent: amount('the yield change', { min: -90, max: 100, unit: '%' })
		.default(0)
		.describe("Applied to the yield on top of the practice's own adjustment; negative for a loss.")
});
export type PlanAdjustment = z.output<typeof planAdjustmentSchema>;

export const planSchema = z.strictObject({
	name: name('the plan name'),
	horizon: z.strictObject({
		startYear: yearSchema,
		years: amount('the plan length', { min: 1, max: 30, integer: true, unit: 'years' })
	}),
	fieldRotations: list(
		'field rotations',
		z.strictObject({
			fieldId: id('the field id'),
			rotationId: id('the rotation id'),
			startingPhase: amount('the starting phase', { min: 1, max: 30, integer: true })
				.default(1)
				.describe("1 = the rotation's first practice in the first plan year.")
		}),
		{ max: 2000 }
	),
	assumptions: list('assumptions', text('an assumption', { max: 1000 }), { max: 100 })
		.default([])
		.describe('Plain statements shown with the results (what the plan takes for granted).'),
	adjustments: list('adjustments', planAdjustmentSchema, { max: 200 })
		.default([])
		.describe(
			'Changes the plan tests on top of its practices: an N rate change and a yield change, for one practice, one field, both, or (naming neither) every field.'
		)
});

const planDocumentShape = z.strictObject({
	formatVersion: z.literal(currentFormatVersion, {
		error: 'formatVersion is 2 (files of the first format, 1, are read too).'
	}),
	notes: notes('the notes'),
	farm: farmSchema,
	crops: list('crops', cropSchema, { max: 200 })
		.default([])
		.describe('Crops of your own beside the built-in eight; one with a built-in id replaces it.'),
	fields: list('fields', fieldSchema, { min: 1, max: 2000 }),
	people: list('people', personSchema, { max: 100 })
		.default([])
		.describe(
			"Who works on the farm. When any are given, farm.labourHoursAvailableByMonth is the operator's, partners' and family's hours summed."
		),
	herd: herdSchema.nullable().default(null),
	operations: list('operations', fieldOperationSchema, { max: 500 }).default([]),
	practices: list('practices', cropPracticeSchema, { min: 1, max: 500 }),
	rotations: list('rotations', rotationSchema, { min: 1, max: 500 }),
	priceSets: list('price sets', priceSetSchema, { min: 1, max: 60 }),
	plan: planSchema
});

type Shape = z.output<typeof planDocumentShape>;
type Path = (string | number)[];
type CropPracticeShape = Omit<z.output<typeof cropPracticeSchema>, 'id'>;

/** Largest yield goal per acre by sale unit: bounds that catch slips (common practice, no published source). */
const maxYieldGoalBySaleUnit = new Map([
	['bu', 500],
	['cwt', 1000],
	['ton', 50],
	['lb', 50_000]
]);

// A cent a bushel: below it the N price ratio is meaningless (and grows past any finite number).
const minGrainPriceForResponse = 0.01;

/** Hired help has a wage and family members none; the farm's hours are the family's summed. */
function checkPeople(doc: Shape, refuse: (path: Path, message: string) => void) {
	const family = doc.people.filter((person) => isFamilyLabour(person.role));
	doc.people.forEach((person, i) => {
		const message = wageMessage(person);
		if (message) refuse(['people', i, 'wageUsdPerHour'], message);
	});
	if (!family.length) return;
	const summed = familyHoursByMonth(doc.people);
	const stated = doc.farm.labourHoursAvailableByMonth;
	if (stated.length === 12 && summed.some((hours, m) => Math.abs(hours - stated[m]) > 0.5)) {
		refuse(
			['farm', 'labourHoursAvailableByMonth'],
			`Farm labour hours must be the operator's, partners' and family's hours summed: ${summed.map((h) => Math.round(h)).join(', ')}.`
		);
	}
}

/** The operator's, partners' and family's hours summed by month: the farm's own labour. */
export function familyHoursByMonth(
	people: Pick<Person, 'role' | 'hoursAvailableByMonth'>[]
): number[] {
	const hours = Array.from({ length: 12 }, () => 0);
	for (const person of people) {
		if (!isFamilyLabour(person.role)) continue;
		person.hoursAvailableByMonth.forEach((h, m) => {
			if (m < 12) hours[m] += h;
		});
	}
	return hours;
}

/** One problem with a practice or rotation, its path inside that practice or rotation. */
export interface PartIssue {
	path: Path;
	message: string;
}

/**
 * What a practice's shape alone cannot check: its crop is known (and takes an N response curve only when
 * sold by the bushel and not a legume), its yield goal fits the crop's sale unit, its seed has one rate,
 * its operations are known and an economic-optimum rate has a curve. Plan files and the practices API
 * both ask this.
 */
export function practiceIssues(
	practice: CropPracticeShape,
	crops: ReadonlyMap<string, CropDefinition>,
	operationIds: ReadonlySet<string>
): PartIssue[] {
	const issues: PartIssue[] = [];
	const refuse = (path: Path, message: string) => issues.push({ path, message });
	const crop = crops.get(practice.crop);
	if (!crop) {
		refuse(['crop'], `Unknown crop "${practice.crop}": add it to crops or use a built-in crop`);
	} else {
		const maxGoal = maxYieldGoalBySaleUnit.get(crop.soldBy)!;
		if (practice.yieldGoalPerAcre > maxGoal) {
			refuse(
				['yieldGoalPerAcre'],
				`A ${crop.name} yield goal is at most ${maxGoal.toLocaleString('en-US')} ${crop.soldBy} per acre.`
			);
		}
		if (practice.nitrogen.response && crop.soldBy !== 'bu') {
			refuse(
				['nitrogen', 'response'],
				`N response curves are in bu/ac: ${crop.name} is sold by the ${crop.soldBy}`
			);
		}
		if (practice.nitrogen.response && crop.legume) {
			refuse(['nitrogen', 'response'], `${crop.name} is a legume: it takes no N response curve`);
		}
		const residue = practice.residueGrazing;
		if (
			residue &&
			residue.leafHuskLbDmPerUnit === undefined &&
			crop.residueLeafHuskLbDmPerUnit === null
		) {
			refuse(
				['residueGrazing', 'leafHuskLbDmPerUnit'],
				`${crop.name} has no grazable residue of its own: state the leaf and husk per ${crop.soldBy}`
			);
		}
	}
	if (practice.seed) {
		const { seedsPerAcre, lbPerAcre } = practice.seed;
		if ((seedsPerAcre === undefined) === (lbPerAcre === undefined)) {
			refuse(['seed'], 'Give either seedsPerAcre or lbPerAcre');
		}
	}
	practice.operations.forEach((step, j) => {
		if (!operationIds.has(step.operationId)) {
			refuse(['operations', j, 'operationId'], `Unknown operation "${step.operationId}"`);
		}
	});
	if (practice.nitrogen.appliedLbPerAcre === 'economic-optimum' && !practice.nitrogen.response) {
		refuse(
			['nitrogen', 'appliedLbPerAcre'],
			'An economic-optimum rate needs a nitrogen response curve'
		);
	}
	return issues;
}

/** Every practice a rotation names is known (plan files and the rotations API both ask). */
export function rotationIssues(
	rotation: Pick<z.output<typeof rotationSchema>, 'practices'>,
	practiceIds: ReadonlySet<string>
): PartIssue[] {
	return rotation.practices.flatMap((practiceId, j) =>
		practiceIds.has(practiceId)
			? []
			: [{ path: ['practices', j], message: `Unknown practice "${practiceId}"` }]
	);
}

/** Refuses cross-references the shape alone cannot: unknown ids, duplicates, phases, missing prices. */
function checkReferences(doc: Shape, crops: Map<string, CropDefinition>, ctx: z.RefinementCtx) {
	const refuse = (path: Path, message: string) => ctx.addIssue({ code: 'custom', path, message });
	const uniqueIds = (items: { id: string }[], path: string) => {
		const seen = new Set<string>();
		items.forEach((item, i) => {
			if (seen.has(item.id)) refuse([path, i, 'id'], `Duplicate id "${item.id}"`);
			seen.add(item.id);
		});
		return seen;
	};
	uniqueIds(doc.crops, 'crops');
	const fieldIds = uniqueIds(doc.fields, 'fields');
	uniqueIds(doc.people, 'people');
	checkPeople(doc, refuse);
	doc.fields.forEach((field, i) => {
		const message = cashRentMessage(field);
		if (message) refuse(['fields', i, 'cashRentUsdPerAcre'], message);
	});
	const operationIds = uniqueIds(doc.operations, 'operations');
	const practiceIds = uniqueIds(doc.practices, 'practices');
	uniqueIds(doc.rotations, 'rotations');
	const practiceById = new Map(doc.practices.map((p) => [p.id, p]));
	const rotationById = new Map(doc.rotations.map((r) => [r.id, r]));
	const customOperationIds = doc.operations.filter((o) => o.by === 'custom').map((o) => o.id);

	const seedsRated = new Set<string>();
	const lbRated = new Set<string>();
	doc.practices.forEach((practice, i) => {
		for (const issue of practiceIssues(practice, crops, operationIds)) {
			refuse(['practices', i, ...issue.path], issue.message);
		}
		if (practice.seed) {
			const { seedsPerAcre, seedId } = practice.seed;
			(seedsPerAcre === undefined ? lbRated : seedsRated).add(seedId);
		}
		practice.coverMix?.species.forEach((s) => lbRated.add(s.seedId));
	});

	doc.rotations.forEach((rotation, i) => {
		for (const issue of rotationIssues(rotation, practiceIds)) {
			refuse(['rotations', i, ...issue.path], issue.message);
		}
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
		const rotation = rotationById.get(assignment.rotationId);
		if (!rotation) {
			refuse([...path, 'rotationId'], `Unknown rotation "${assignment.rotationId}"`);
		} else if (assignment.startingPhase > rotation.practices.length) {
			refuse(
				[...path, 'startingPhase'],
				`Rotation "${rotation.id}" has ${rotation.practices.length} phase(s); starting phase ${assignment.startingPhase} is out of range`
			);
		}
	});
	doc.plan.adjustments.forEach((adjustment, i) => {
		const path: Path = ['plan', 'adjustments', i];
		if (adjustment.fieldId !== undefined && !fieldIds.has(adjustment.fieldId)) {
			refuse([...path, 'fieldId'], `Unknown field "${adjustment.fieldId}"`);
		}
		if (adjustment.practiceId !== undefined && !practiceById.has(adjustment.practiceId)) {
			refuse([...path, 'practiceId'], `Unknown practice "${adjustment.practiceId}"`);
		}
	});
	doc.fields.forEach((field, i) => {
		if (!assigned.has(field.id))
			refuse(['fields', i, 'id'], `Field "${field.id}" has no rotation in the plan`);
	});

	const usedPracticeIds = new Set(
		doc.plan.fieldRotations.flatMap((a) => rotationById.get(a.rotationId)?.practices ?? [])
	);
	const priceSetIndexByYear = new Map<number, number>();
	doc.priceSets.forEach((set, i) => {
		if (priceSetIndexByYear.has(set.year))
			refuse(['priceSets', i, 'year'], `Duplicate price set for ${set.year}`);
		priceSetIndexByYear.set(set.year, i);
		const cropPrices = new Map(Object.entries(set.cropPricesUsdPerUnit));
		const seedPrices = new Map(Object.entries(set.seedPrices));
		const customRates = new Map(Object.entries(set.customRatesUsdPerAcre));
		for (const practiceId of usedPracticeIds) {
			const practice = practiceById.get(practiceId);
			const crop = practice && crops.get(practice.crop);
			if (!practice || !crop) continue;
			const price = cropPrices.get(crop.id);
			if (price === undefined) {
				refuse(
					['priceSets', i, 'cropPricesUsdPerUnit', crop.id],
					`No price for ${crop.name} (practice "${practiceId}")`
				);
			} else if (practice.nitrogen.response && price < minGrainPriceForResponse) {
				// The N price ratio ($/lb N ÷ $/bu) has no meaning at a grain price of zero.
				refuse(
					['priceSets', i, 'cropPricesUsdPerUnit', crop.id],
					`A ${crop.name} price of at least $0.01 a bushel is needed for the N response of practice "${practiceId}"`
				);
			}
		}
		for (const seedId of seedsRated) {
			if (seedPrices.get(seedId)?.usdPerThousandSeeds === undefined) {
				refuse(
					['priceSets', i, 'seedPrices', seedId, 'usdPerThousandSeeds'],
					`No price per 1,000 seeds for "${seedId}"`
				);
			}
		}
		for (const seedId of lbRated) {
			if (seedPrices.get(seedId)?.usdPerLb === undefined) {
				refuse(
					['priceSets', i, 'seedPrices', seedId, 'usdPerLb'],
					`No price per lb for "${seedId}"`
				);
			}
		}
		for (const operationId of customOperationIds) {
			if (!customRates.has(operationId)) {
				refuse(
					['priceSets', i, 'customRatesUsdPerAcre', operationId],
					`No custom rate for "${operationId}"`
				);
			}
		}
	});
	// References are checked even when a value is out of range: a plan length past its range is not walked.
	const { startYear, years } = doc.plan.horizon;
	const yearsToCheck = Number.isInteger(years) && years >= 1 && years <= 30 ? years : 0;
	for (let year = startYear; year < startYear + yearsToCheck; year++) {
		if (!priceSetIndexByYear.has(year)) refuse(['priceSets'], `No price set for plan year ${year}`);
	}
}

/**
 * The parsed document: the crop list holds the built-ins with the file's own, and each practice's
 * residue grazing states its leaf and husk per unit (the crop's own figure when the file leaves it out).
 */
const cropMap = (doc: Shape) =>
	new Map(cropsWithBuiltIns(doc.crops.filter((crop) => crop?.id)).map((crop) => [crop.id, crop]));

/**
 * The parsed document: the crop list holds the built-ins with the file's own, and each practice's
 * residue grazing states its leaf and husk per unit (the crop's own figure when the file leaves it out).
 * References are checked even when some values are out of range, so one pass names every problem.
 */
export const planDocumentSchema = planDocumentShape
	.superRefine((doc, ctx) => checkReferences(doc, cropMap(doc), ctx))
	.transform((doc) => {
		const cropById = cropMap(doc);
		return {
			...doc,
			crops: [...cropById.values()],
			practices: doc.practices.map((practice) => {
				const residue = practice.residueGrazing;
				if (!residue) return { ...practice, residueGrazing: null };
				const ownFigure = cropById.get(practice.crop)?.residueLeafHuskLbDmPerUnit ?? 0;
				return {
					...practice,
					residueGrazing: {
						utilisationPercent: residue.utilisationPercent,
						leafHuskLbDmPerUnit: residue.leafHuskLbDmPerUnit ?? ownFigure
					}
				};
			})
		};
	});

export type PlanDocument = z.output<typeof planDocumentSchema>;
export type PlanDocumentInput = z.input<typeof planDocumentSchema>;
export type FieldOperation = PlanDocument['operations'][number];
export type CropPractice = PlanDocument['practices'][number];
export type PriceSet = PlanDocument['priceSets'][number];
export type Herd = NonNullable<PlanDocument['herd']>;
export type Person = z.output<typeof personSchema>;
export type { CropDefinition };

export type ParsePlanResult =
	{ ok: true; plan: PlanDocument; readFormatVersion: 1 | 2 } | { ok: false; issues: FieldIssue[] };

/** Reads a plan document of format 1 or 2; the parsed plan is always format 2. */
export function parsePlanDocument(input: unknown): ParsePlanResult {
	const isFormat1 =
		typeof input === 'object' &&
		input !== null &&
		'formatVersion' in input &&
		input.formatVersion === 1;
	const upgraded = isFormat1
		? upgradeFormat1(input)
		: { ok: true as const, document: input, pathInFormat1: (issue: FieldIssue) => issue };
	if (!upgraded.ok) return upgraded;
	const result = planDocumentSchema.safeParse(upgraded.document);
	if (!result.success) {
		return { ok: false, issues: toFieldIssues(result.error).map(upgraded.pathInFormat1) };
	}
	return { ok: true, plan: result.data, readFormatVersion: isFormat1 ? 1 : 2 };
}
