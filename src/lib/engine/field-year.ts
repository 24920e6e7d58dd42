import type { SaleUnit } from '../schemas/crops';
import type {
	CropDefinition,
	CropPractice,
	FieldOperation,
	Herd,
	PlanDocument
} from '../schemas/plan-file';
import { animalUnitDaysFromDm, coverGrazedLbDmPerAcre, residueGrazedLbDmPerAcre } from './forage';
import {
	customOperationTotals,
	ownOperationTotals,
	perAcreOperationTotals,
	type OperationTotals
} from './machinery';
import {
	economicOptimumNLbPerAcre,
	grazingManureCreditLbPerAcre,
	legumeCoverCreditLbPerAcre,
	nitrogenPriceRatio,
	plateauJoinLbN,
	plateauYieldBuPerAcre,
	responseYieldBuPerAcre
} from './nitrogen';
import type { YearPrices } from './prices';
import { daysPerAnimalUnitMonth, inchesPerFoot, squareFeetPerAcre } from './units';

export type Field = PlanDocument['fields'][number];

export interface OperationResult extends OperationTotals {
	operationId: string;
	name: string;
	month: number;
	passes: number;
	by: 'own' | 'custom';
}

export interface NitrogenLedger {
	/** Price ratio ($/lb N ÷ $/bu) of the year, when the practice has a response curve. */
	priceRatio: number | null;
	/** Where the last pound of N pays for itself on the field's own (scaled) yield curve. */
	economicOptimumLbPerAcre: number | null;
	/** Where the curve levels off: more N adds no yield (b ÷ 2c). */
	agronomicMaximumLbPerAcre: number | null;
	/** N the crop should have available: the economic optimum, or the applied rate without a curve. */
	needLbPerAcre: number;
	priorCropCreditLbPerAcre: number;
	coverCreditLbPerAcre: number;
	manureCreditLbPerAcre: number;
	appliedLbPerAcre: number;
	availableLbPerAcre: number;
	/** Yield at the available N as a share of the plateau yield (1 without a curve). */
	responseFactor: number;
	purchasedLb: number;
}

export interface ForageOffered {
	coverLbDmPerAcre: number;
	residueLbDmPerAcre: number;
	offeredLbDm: number;
	/** AU-days of grazing the field offers. */
	grazingAuDays: number;
	grazingAums: number;
	/** AU-days the herd ate here: its grazing shared out in proportion to what each field offered. */
	eatenAuDays: number;
}

export interface FieldYearResult {
	fieldId: string;
	fieldName: string;
	year: number;
	rotationId: string;
	practiceId: string;
	practiceName: string;
	crop: string;
	cropName: string;
	acres: number;
	yieldUnit: SaleUnit;
	yieldPerAcre: number;
	production: number;
	priceUsdPerUnit: number;
	revenueUsd: number;
	seedsPerFootOfRow: number | null;
	directCosts: {
		seedUsd: number;
		nitrogenUsd: number;
		otherFertiliserUsd: number;
		chemicalsUsd: number;
		otherDirectUsd: number;
		coverSeedUsd: number;
		customHireUsd: number;
		operatingInterestUsd: number;
		totalUsd: number;
	};
	operationCosts: { fuelUsd: number; repairsUsd: number; labourUsd: number; totalUsd: number };
	/** The field's cash rent for the year, its land cost (0 on owned land). */
	cashRentUsd: number;
	costsUsd: number;
	netReturnUsd: number;
	netReturnUsdPerAcre: number;
	operations: OperationResult[];
	machineHours: number;
	machineHoursByMonth: number[];
	labourHours: number;
	labourHoursByMonth: number[];
	dieselGallons: number;
	nitrogen: NitrogenLedger;
	forage: ForageOffered;
}

/** N credits a field-year leaves for the next crop on the same field, lb N/ac. */
export interface CarriedCredits {
	priorCropCreditLbPerAcre: number;
	coverCreditLbPerAcre: number;
	manureCreditLbPerAcre: number;
}

export interface FieldYearInput {
	field: Field;
	year: number;
	rotationId: string;
	practice: CropPractice;
	crop: CropDefinition;
	prices: YearPrices;
	herd: Herd | null;
	operationsById: Map<string, FieldOperation>;
	interestRatePercent: number;
	credits: CarriedCredits;
	/** The plan's change to the N the practice applies this year, lb N/ac (0: none). */
	nitrogenChangeLbPerAcre?: number;
}

/** Row feet in an acre at a row spacing, and the seeds that fall on each foot. */
export function seedsPerFootOfRow(seedsPerAcre: number, rowSpacingIn: number): number {
	const rowFeetPerAcre = squareFeetPerAcre / (rowSpacingIn / inchesPerFoot);
	return seedsPerAcre / rowFeetPerAcre;
}

/** Yield goal × productivity × the practice's own adjustment: the yield at the curve's plateau. */
function plateauYieldPerAcre(field: Field, practice: CropPractice): number {
	return (
		practice.yieldGoalPerAcre *
		field.productivityIndex *
		(1 + practice.yieldAdjustmentPercent / 100)
	);
}

function nitrogenLedger(input: FieldYearInput, cropPrice: number): NitrogenLedger {
	const { practice, prices, field, credits } = input;
	const response = practice.nitrogen.response;
	const creditLbPerAcre =
		credits.priorCropCreditLbPerAcre + credits.coverCreditLbPerAcre + credits.manureCreditLbPerAcre;
	const priceRatio = response ? nitrogenPriceRatio(prices.nitrogenUsdPerLb, cropPrice) : null;
	// The field's bushels per bushel of the curve: the price ratio is met on the curve the yield follows.
	const yieldScale = response
		? plateauYieldPerAcre(field, practice) / plateauYieldBuPerAcre(response)
		: 1;
	const optimum =
		response && priceRatio !== null
			? economicOptimumNLbPerAcre(response, priceRatio, yieldScale)
			: null;
	const stated = practice.nitrogen.appliedLbPerAcre;
	const planned =
		stated === 'economic-optimum' ? Math.max((optimum ?? 0) - creditLbPerAcre, 0) : stated;
	const applied = Math.max(planned + (input.nitrogenChangeLbPerAcre ?? 0), 0);
	const available = applied + creditLbPerAcre;
	return {
		priceRatio,
		economicOptimumLbPerAcre: optimum,
		agronomicMaximumLbPerAcre: response ? plateauJoinLbN(response) : null,
		needLbPerAcre: optimum ?? applied,
		...credits,
		appliedLbPerAcre: applied,
		availableLbPerAcre: available,
		responseFactor: response
			? responseYieldBuPerAcre(response, available) / plateauYieldBuPerAcre(response)
			: 1,
		purchasedLb: applied * field.acres
	};
}

function operationResults(input: FieldYearInput): OperationResult[] {
	const { practice, prices, field, operationsById } = input;
	return practice.operations.map((step) => {
		const operation = operationsById.get(step.operationId)!;
		const acresCovered = field.acres * step.passes;
		const totals =
			operation.by === 'custom'
				? customOperationTotals(acresCovered, prices.customRatesUsdPerAcre.get(operation.id) ?? 0)
				: operation.statedAs === 'machine'
					? ownOperationTotals(
							operation,
							acresCovered,
							prices.dieselUsdPerGallon,
							prices.labourUsdPerHour
						)
					: perAcreOperationTotals(
							operation,
							acresCovered,
							prices.dieselUsdPerGallon,
							prices.labourUsdPerHour
						);
		return {
			operationId: operation.id,
			name: operation.name,
			month: step.month ?? operation.month,
			passes: step.passes,
			by: operation.by,
			...totals
		};
	});
}

function seedUsdPerAcre(practice: CropPractice, prices: YearPrices): number {
	const seed = practice.seed;
	if (!seed) return 0;
	const price = prices.seedPrices.get(seed.seedId);
	return seed.seedsPerAcre !== undefined
		? (seed.seedsPerAcre / 1000) * (price?.usdPerThousandSeeds ?? 0)
		: (seed.lbPerAcre ?? 0) * (price?.usdPerLb ?? 0);
}

/** One crop practice on one field in one year: yield, revenue, costs, hours, diesel, N and forage. */
export function evaluateFieldYear(input: FieldYearInput): FieldYearResult {
	const { field, practice, crop, prices, herd } = input;
	const acres = field.acres;
	const cropPrice = prices.cropUsdPerUnit.get(crop.id) ?? 0;

	const nitrogen = nitrogenLedger(input, cropPrice);
	const yieldPerAcre = plateauYieldPerAcre(field, practice) * nitrogen.responseFactor;
	const production = yieldPerAcre * acres;
	const revenueUsd = production * cropPrice;

	const operations = operationResults(input);
	const machineHoursByMonth = new Array<number>(12).fill(0);
	const labourHoursByMonth = new Array<number>(12).fill(0);
	let machineHours = 0;
	let labourHours = 0;
	let dieselGallons = 0;
	let fuelUsd = 0;
	let repairsUsd = 0;
	let labourUsd = 0;
	let customHireUsd = 0;
	for (const op of operations) {
		machineHoursByMonth[op.month - 1] += op.machineHours;
		labourHoursByMonth[op.month - 1] += op.labourHours;
		machineHours += op.machineHours;
		labourHours += op.labourHours;
		dieselGallons += op.dieselGallons;
		fuelUsd += op.fuelUsd;
		repairsUsd += op.repairsUsd;
		labourUsd += op.labourUsd;
		customHireUsd += op.customHireUsd;
	}

	const seedUsd = seedUsdPerAcre(practice, prices) * acres;
	const nitrogenUsd = nitrogen.purchasedLb * prices.nitrogenUsdPerLb;
	const otherFertiliserUsd = practice.otherFertiliserUsdPerAcre * acres;
	const chemicalsUsd = practice.chemicalsUsdPerAcre * acres;
	const otherDirectUsd = practice.otherDirectUsdPerAcre * acres;
	const cover = practice.coverMix;
	const coverSeedUsd = cover
		? cover.species.reduce(
				(sum, s) => sum + s.lbPerAcre * (prices.seedPrices.get(s.seedId)?.usdPerLb ?? 0),
				0
			) * acres
		: 0;
	const purchasedInputsUsd =
		seedUsd +
		nitrogenUsd +
		otherFertiliserUsd +
		chemicalsUsd +
		otherDirectUsd +
		coverSeedUsd +
		customHireUsd;
	// Interest on the cash spent before harvest; the family's own labour is not borrowed money.
	const operatingInterestUsd =
		(purchasedInputsUsd + fuelUsd + repairsUsd) *
		(input.interestRatePercent / 100) *
		(practice.operatingInterestMonths / 12);
	const directTotalUsd = purchasedInputsUsd + operatingInterestUsd;
	const operationTotalUsd = fuelUsd + repairsUsd + labourUsd;
	// Rent is a land cost, not an operating input: it carries no operating interest here.
	const cashRentUsd = field.cashRentUsdPerAcre * acres;
	const costsUsd = directTotalUsd + operationTotalUsd + cashRentUsd;

	// Cattle graze only when the farm has a herd; what they eat is what the forage ledger offers.
	const grazed = herd !== null;
	const coverLbDmPerAcre =
		grazed && cover
			? coverGrazedLbDmPerAcre(cover.biomassLbDmPerAcre, cover.grazingUtilisationPercent)
			: 0;
	const residue = practice.residueGrazing;
	const residueLbDmPerAcre =
		grazed && residue
			? residueGrazedLbDmPerAcre(
					yieldPerAcre,
					residue.leafHuskLbDmPerUnit,
					residue.utilisationPercent
				)
			: 0;
	const offeredLbDm = (coverLbDmPerAcre + residueLbDmPerAcre) * acres;
	const grazingAuDays = herd ? animalUnitDaysFromDm(offeredLbDm, herd.intakeLbDmPerAuDay) : 0;

	const rowSpacing = practice.rowSpacingIn;
	const seedsPerAcre = practice.seed?.seedsPerAcre;

	return {
		fieldId: field.id,
		fieldName: field.name,
		year: input.year,
		rotationId: input.rotationId,
		practiceId: practice.id,
		practiceName: practice.name,
		crop: crop.id,
		cropName: crop.name,
		acres,
		yieldUnit: crop.soldBy,
		yieldPerAcre,
		production,
		priceUsdPerUnit: cropPrice,
		revenueUsd,
		seedsPerFootOfRow:
			rowSpacing !== null && seedsPerAcre !== undefined
				? seedsPerFootOfRow(seedsPerAcre, rowSpacing)
				: null,
		directCosts: {
			seedUsd,
			nitrogenUsd,
			otherFertiliserUsd,
			chemicalsUsd,
			otherDirectUsd,
			coverSeedUsd,
			customHireUsd,
			operatingInterestUsd,
			totalUsd: directTotalUsd
		},
		operationCosts: { fuelUsd, repairsUsd, labourUsd, totalUsd: operationTotalUsd },
		cashRentUsd,
		costsUsd,
		netReturnUsd: revenueUsd - costsUsd,
		netReturnUsdPerAcre: (revenueUsd - costsUsd) / acres,
		operations,
		machineHours,
		machineHoursByMonth,
		labourHours,
		labourHoursByMonth,
		dieselGallons,
		nitrogen,
		forage: {
			coverLbDmPerAcre,
			residueLbDmPerAcre,
			offeredLbDm,
			grazingAuDays,
			grazingAums: grazingAuDays / daysPerAnimalUnitMonth,
			// Known once the farm-year has fed the herd: see `shareOutGrazing`.
			eatenAuDays: 0
		}
	};
}

/**
 * The herd's grazing shared out over the fields in proportion to what each offered: when the fields
 * offer more than the herd eats, each field is grazed by the same share of its offer.
 */
export function shareOutGrazing(fieldYears: FieldYearResult[], grazingAuDaysEaten: number) {
	const offered = fieldYears.reduce((sum, fy) => sum + fy.forage.grazingAuDays, 0);
	const eatenShare = offered > 0 ? Math.min(grazingAuDaysEaten / offered, 1) : 0;
	for (const fy of fieldYears) fy.forage.eatenAuDays = fy.forage.grazingAuDays * eatenShare;
	return eatenShare;
}

/**
 * The N credits this field-year leaves for the next crop on the same field. Manure follows what was
 * eaten on the field; of a legume cover, the share the herd ate is not left to decay in the field.
 */
export function creditsForNextYear(
	practice: CropPractice,
	result: FieldYearResult,
	herd: Herd | null,
	eatenShare: number
): CarriedCredits {
	const cover = practice.coverMix;
	const grazedPercent = herd && cover ? cover.grazingUtilisationPercent * eatenShare : 0;
	return {
		priorCropCreditLbPerAcre: practice.nitrogenCreditToNextCropLbPerAcre,
		coverCreditLbPerAcre: cover
			? legumeCoverCreditLbPerAcre(
					cover.biomassLbDmPerAcre,
					cover.legumeSharePercent,
					cover.legumeNitrogenPercent,
					cover.nitrogenAvailablePercent,
					grazedPercent
				)
			: 0,
		manureCreditLbPerAcre: herd
			? grazingManureCreditLbPerAcre(
					result.forage.eatenAuDays / result.acres,
					herd.manureNitrogenLbPerAuDay,
					herd.manureNitrogenAvailablePercent
				)
			: 0
	};
}
