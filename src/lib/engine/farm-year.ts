import type { Herd } from '../schemas/plan-file';
import { feedingYear, type FeedingYear } from './forage';
import type { FieldYearResult } from './field-year';
import { allocateLabour, type HiredHelp } from './labour';
import type { YearPrices } from './prices';

/** The herd's year (demand, grazing, hay, chores) comes from the forage ledger as it is. */
export interface FarmYearResult extends FeedingYear {
	year: number;
	acres: number;
	revenueUsd: number;
	/** Every field's costs, cash rent included. */
	fieldCostsUsd: number;
	/** Cash rent on the rented fields: what a lender reads as the land cost. */
	cashRentUsd: number;
	hayCostUsd: number;
	/** What the hay grazing saved would have cost: bales avoided × the year's hay price. */
	hayUsdAvoided: number;
	/** Acres the herd grazed: fields offering forage, in a year the herd grazed at all. */
	grazedAcres: number;
	hayUsdAvoidedPerGrazedAcre: number;
	choreLabourUsd: number;
	/**
	 * Every hour of work is charged at the labour rate in the field and chore costs; the hours hired
	 * help works cost its wage instead: this is the wages less those hours at the labour rate (below 0
	 * when help is paid less than the rate).
	 */
	hiredWageAdjustmentUsd: number;
	/** What hired help is paid: its hours at its wage. */
	hiredLabourUsd: number;
	hiredLabourHours: number;
	hiredLabourHoursByMonth: number[];
	fixedCostsUsd: number;
	costsUsd: number;
	netReturnUsd: number;
	netReturnUsdPerAcre: number;
	/** Net return before the family's labour charge, per hour the family works (field work and chores). */
	netReturnUsdPerFamilyLabourHour: number | null;
	nitrogenPurchasedLb: number;
	dieselGallons: number;
	machineHours: number;
	fieldLabourHours: number;
	labourHours: number;
	labourHoursByMonth: number[];
	labourHoursAvailableByMonth: number[];
	labourShortfallHoursByMonth: number[];
}

// Less than a minute's work in a year gives no meaningful return per hour (and can divide past any number).
const minLabourHoursForHourlyReturn = 0.01;

/** Whole-farm totals for one year: the field-years summed, then the herd fed by grazing and hay. */
export function evaluateFarmYear(
	year: number,
	fieldYears: FieldYearResult[],
	herd: Herd | null,
	prices: YearPrices,
	farm: { labourHoursAvailableByMonth: number[]; fixedCostsUsdPerYear: number },
	hiredHelp: HiredHelp[] = []
): FarmYearResult {
	const { labourHoursAvailableByMonth, fixedCostsUsdPerYear: fixedCostsUsd } = farm;
	let acres = 0;
	let revenueUsd = 0;
	let fieldCostsUsd = 0;
	let fieldLabourUsd = 0;
	let cashRentUsd = 0;
	let nitrogenPurchasedLb = 0;
	let dieselGallons = 0;
	let machineHours = 0;
	let fieldLabourHours = 0;
	let grazingAuDaysOffered = 0;
	let acresOffering = 0;
	const labourHoursByMonth = new Array<number>(12).fill(0);
	for (const fy of fieldYears) {
		acres += fy.acres;
		revenueUsd += fy.revenueUsd;
		fieldCostsUsd += fy.costsUsd;
		fieldLabourUsd += fy.operationCosts.labourUsd;
		cashRentUsd += fy.cashRentUsd;
		nitrogenPurchasedLb += fy.nitrogen.purchasedLb;
		dieselGallons += fy.dieselGallons;
		machineHours += fy.machineHours;
		fieldLabourHours += fy.labourHours;
		grazingAuDaysOffered += fy.forage.grazingAuDays;
		if (fy.forage.grazingAuDays > 0) acresOffering += fy.acres;
		for (let m = 0; m < 12; m++) labourHoursByMonth[m] += fy.labourHoursByMonth[m];
	}

	const feeding = herd ? feedingYear(herd, grazingAuDaysOffered) : null;
	const choreHours = feeding?.choreHours ?? 0;
	if (feeding) for (let m = 0; m < 12; m++) labourHoursByMonth[m] += feeding.choreHoursByMonth[m];
	const hayBales = feeding?.hayBales ?? 0;
	const hayCostUsd = hayBales * prices.hayUsdPerBale;
	const hayUsdAvoided = (feeding?.hayBalesAvoided ?? 0) * prices.hayUsdPerBale;
	const grazedAcres = (feeding?.grazingAuDays ?? 0) > 0 ? acresOffering : 0;
	const choreLabourUsd = choreHours * prices.labourUsdPerHour;
	const hired = allocateLabour(
		labourHoursByMonth,
		labourHoursAvailableByMonth,
		hiredHelp,
		prices.labourUsdPerHour
	);
	const hiredWageAdjustmentUsd = hired.hiredWagesUsd - hired.hiredHours * prices.labourUsdPerHour;
	const costsUsd =
		fieldCostsUsd + hayCostUsd + choreLabourUsd + hiredWageAdjustmentUsd + fixedCostsUsd;
	const netReturnUsd = revenueUsd - costsUsd;
	const labourHours = fieldLabourHours + choreHours;
	const familyLabourHours = labourHours - hired.hiredHours;
	// The family's own hours, charged at the labour rate (the hired hours' wages stay a cost).
	const familyLabourUsd =
		fieldLabourUsd + choreLabourUsd - hired.hiredHours * prices.labourUsdPerHour;

	return {
		year,
		acres,
		revenueUsd,
		fieldCostsUsd,
		cashRentUsd,
		hayCostUsd,
		hayUsdAvoided,
		grazedAcres,
		hayUsdAvoidedPerGrazedAcre: grazedAcres > 0 ? hayUsdAvoided / grazedAcres : 0,
		choreLabourUsd,
		hiredWageAdjustmentUsd,
		hiredLabourUsd: hired.hiredWagesUsd,
		hiredLabourHours: hired.hiredHours,
		hiredLabourHoursByMonth: hired.hiredHoursByMonth,
		fixedCostsUsd,
		costsUsd,
		netReturnUsd,
		netReturnUsdPerAcre: netReturnUsd / acres,
		netReturnUsdPerFamilyLabourHour:
			familyLabourHours >= minLabourHoursForHourlyReturn
				? (netReturnUsd + familyLabourUsd) / familyLabourHours
				: null,
		nitrogenPurchasedLb,
		dieselGallons,
		machineHours,
		fieldLabourHours,
		choreHours,
		choreHoursByMonth: feeding?.choreHoursByMonth ?? new Array<number>(12).fill(0),
		labourHours,
		labourHoursByMonth,
		labourHoursAvailableByMonth,
		labourShortfallHoursByMonth: labourHoursByMonth.map((h, m) =>
			Math.max(h - labourHoursAvailableByMonth[m], 0)
		),
		animalUnits: feeding?.animalUnits ?? 0,
		herdDemandAuDays: feeding?.herdDemandAuDays ?? 0,
		grazingAuDaysOffered,
		grazingAuDays: feeding?.grazingAuDays ?? 0,
		grazingDays: feeding?.grazingDays ?? 0,
		hayFeedingDays: feeding?.hayFeedingDays ?? 0,
		hayDmLb: feeding?.hayDmLb ?? 0,
		hayBales,
		hayBalesAvoided: feeding?.hayBalesAvoided ?? 0
	};
}
