import {
	isGrain,
	type CropPractice,
	type FieldOperation,
	type Herd,
	type PlanDocument,
	type PriceSet
} from '../schemas/plan-file';
import { animalUnitDaysFromDm, coverGrazedLbDmPerAcre, residueGrazedLbDmPerAcre } from './forage';
import { customOperationTotals, ownOperationTotals, type OperationTotals } from './machinery';
import {
	economicOptimumNLbPerAcre,
	grazingManureCreditLbPerAcre,
	legumeCoverCreditLbPerAcre,
	nitrogenPriceRatio,
	plateauYieldBuPerAcre,
	responseYieldBuPerAcre
} from './nitrogen';
import { daysPerAnimalUnitMonth, inchesPerFoot, squareFeetPerAcre, yieldUnit } from './units';

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
	economicOptimumLbPerAcre: number | null;
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
	grazingAuDays: number;
	grazingAums: number;
}

export interface FieldYearResult {
	fieldId: string;
	fieldName: string;
	year: number;
	rotationId: string;
	practiceId: string;
	practiceName: string;
	crop: CropPractice['crop'];
	acres: number;
	yieldUnit: 'bu' | 'ton';
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
	prices: PriceSet;
	herd: Herd | null;
	operationsById: Map<string, FieldOperation>;
	interestRatePercent: number;
	credits: CarriedCredits;
}

/** Row feet in an acre at a row spacing, and the seeds that fall on each foot. */
export function seedsPerFootOfRow(seedsPerAcre: number, rowSpacingIn: number): number {
	const rowFeetPerAcre = squareFeetPerAcre / (rowSpacingIn / inchesPerFoot);
	return seedsPerAcre / rowFeetPerAcre;
}

function nitrogenLedger(input: FieldYearInput, cropPrice: number): NitrogenLedger {
	const { practice, prices, field, credits } = input;
	const response = practice.nitrogen.response;
	const creditLbPerAcre =
		credits.priorCropCreditLbPerAcre + credits.coverCreditLbPerAcre + credits.manureCreditLbPerAcre;
	const priceRatio = response ? nitrogenPriceRatio(prices.nitrogenUsdPerLb, cropPrice) : null;
	const optimum =
		response && priceRatio !== null ? economicOptimumNLbPerAcre(response, priceRatio) : null;
	const stated = practice.nitrogen.appliedLbPerAcre;
	const applied =
		stated === 'economic-optimum' ? Math.max((optimum ?? 0) - creditLbPerAcre, 0) : stated;
	const available = applied + creditLbPerAcre;
	return {
		priceRatio,
		economicOptimumLbPerAcre: optimum,
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
			operation.by === 'own'
				? ownOperationTotals(
						operation,
						acresCovered,
						prices.dieselUsdPerGallon,
						prices.labourUsdPerHour
					)
				: customOperationTotals(acresCovered, prices.customRatesUsdPerAcre[operation.id]);
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

function seedUsdPerAcre(practice: CropPractice, prices: PriceSet): number {
	const seed = practice.seed;
	if (!seed) return 0;
	const price = prices.seedPrices[seed.seedId];
	return seed.seedsPerAcre !== undefined
		? (seed.seedsPerAcre / 1000) * (price.usdPerThousandSeeds ?? 0)
		: (seed.lbPerAcre ?? 0) * (price.usdPerLb ?? 0);
}

/** One crop practice on one field in one year: yield, revenue, costs, hours, diesel, N and forage. */
export function evaluateFieldYear(input: FieldYearInput): FieldYearResult {
	const { field, practice, prices, herd } = input;
	const acres = field.acres;
	const cropPrice = prices.cropPricesUsdPerUnit[practice.crop] ?? 0;

	const nitrogen = nitrogenLedger(input, cropPrice);
	const yieldPerAcre =
		practice.yieldGoalPerAcre *
		field.productivityIndex *
		nitrogen.responseFactor *
		(1 + practice.yieldAdjustmentPercent / 100);
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
				(sum, s) => sum + s.lbPerAcre * (prices.seedPrices[s.seedId].usdPerLb ?? 0),
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
	const costsUsd = directTotalUsd + operationTotalUsd;

	// Cattle graze only when the farm has a herd; what they eat is what the forage ledger offers.
	const grazed = herd !== null;
	const coverLbDmPerAcre =
		grazed && cover
			? coverGrazedLbDmPerAcre(cover.biomassLbDmPerAcre, cover.grazingUtilisationPercent)
			: 0;
	const residue = practice.residueGrazing;
	const residueLbDmPerAcre =
		grazed && residue && isGrain(practice.crop)
			? residueGrazedLbDmPerAcre(
					yieldPerAcre,
					residue.leafHuskLbDmPerBu,
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
		crop: practice.crop,
		acres,
		yieldUnit: yieldUnit(practice.crop),
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
			grazingAums: grazingAuDays / daysPerAnimalUnitMonth
		}
	};
}

/** The N credits this field-year leaves for the next crop on the same field. */
export function creditsForNextYear(
	practice: CropPractice,
	result: FieldYearResult,
	herd: Herd | null
): CarriedCredits {
	const cover = practice.coverMix;
	const grazedPercent = herd && cover ? cover.grazingUtilisationPercent : 0;
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
					result.forage.grazingAuDays / result.acres,
					herd.manureNitrogenLbPerAuDay,
					herd.manureNitrogenAvailablePercent
				)
			: 0
	};
}
