import { daysPerAnimalUnitMonth, lbLiveWeightPerAnimalUnit } from './animal-units';

/** Animal units: live weight ÷ 1,000 lb (Society for Range Management glossary). */
export function animalUnits(head: number, averageWeightLb: number): number {
	return (head * averageWeightLb) / lbLiveWeightPerAnimalUnit;
}

/** Dry matter one animal unit eats in an animal-unit month (SRM: 26 lb/day × 30 days = 780 lb). */
export function lbDmPerAnimalUnitMonth(intakeLbDmPerAuDay: number): number {
	return intakeLbDmPerAuDay * daysPerAnimalUnitMonth;
}

export function animalUnitDaysFromDm(lbDm: number, intakeLbDmPerAuDay: number): number {
	return lbDm / intakeLbDmPerAuDay;
}

/** Corn residue cattle eat: bushels × leaf and husk per bushel × utilisation (UNL, Rasby 2007). */
export function residueGrazedLbDmPerAcre(
	yieldBuPerAcre: number,
	leafHuskLbDmPerBu: number,
	utilisationPercent: number
): number {
	return yieldBuPerAcre * leafHuskLbDmPerBu * (utilisationPercent / 100);
}

export function coverGrazedLbDmPerAcre(
	biomassLbDmPerAcre: number,
	utilisationPercent: number
): number {
	return biomassLbDmPerAcre * (utilisationPercent / 100);
}

/**
 * Hay to buy, as fed. Feeding waste is the share of the hay put out that cattle do not eat (Oklahoma
 * State, Lalman: waste as a share of the bale), so what is put out is what is eaten ÷ (1 − waste).
 */
export function hayAsFedLb(
	dmLb: number,
	dryMatterPercent: number,
	feedingWastePercent: number
): number {
	return dmLb / (dryMatterPercent / 100) / (1 - feedingWastePercent / 100);
}

export function hayBales(
	dmLb: number,
	baleWeightLb: number,
	dryMatterPercent: number,
	feedingWastePercent: number
): number {
	return hayAsFedLb(dmLb, dryMatterPercent, feedingWastePercent) / baleWeightLb;
}

export interface HerdForFeeding {
	head: number;
	averageWeightLb: number;
	intakeLbDmPerAuDay: number;
	feedingSeasonStartMonth: number;
	feedingSeasonDays: number;
	maxGrazingDays: number | null;
	baleWeightLb: number;
	baleDryMatterPercent: number;
	feedingWastePercent: number;
	choreHoursPerDayFeedingHay: number;
	choreHoursPerDayGrazing: number;
}

export interface FeedingYear {
	animalUnits: number;
	herdDemandAuDays: number;
	grazingAuDaysOffered: number;
	grazingAuDays: number;
	grazingDays: number;
	hayFeedingDays: number;
	hayDmLb: number;
	hayBales: number;
	/** Bales the herd would have eaten on the days it grazed instead: the hay grazing saved. */
	hayBalesAvoided: number;
	choreHours: number;
	choreHoursByMonth: number[];
}

// Days in each month of a common (non-leap) year: a plan year is a typical year, not a calendar one.
const daysInMonth = [31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31];

/**
 * Spreads `days` of work at `hoursPerDay` over the calendar from day `fromDay` of the feeding season,
 * which starts on the 1st of `startMonth`; a season that runs past December wraps to January of the
 * same plan year.
 */
function addChoreHours(
	byMonth: number[],
	startMonth: number,
	fromDay: number,
	days: number,
	hoursPerDay: number
) {
	let month = startMonth - 1;
	let monthStartDay = 0;
	const toDay = fromDay + days;
	while (monthStartDay < toDay) {
		const monthEndDay = monthStartDay + daysInMonth[month];
		const overlap = Math.min(monthEndDay, toDay) - Math.max(monthStartDay, fromDay);
		if (overlap > 0) byMonth[month] += overlap * hoursPerDay;
		monthStartDay = monthEndDay;
		month = (month + 1) % 12;
	}
}

/**
 * The herd's feeding season: demand in AU-days is met by grazing first (up to what the fields offer and
 * the days snow allows), then by hay; chores differ between hay-feeding and grazing days.
 */
export function feedingYear(herd: HerdForFeeding, grazingAuDaysOffered: number): FeedingYear {
	const units = animalUnits(herd.head, herd.averageWeightLb);
	const herdDemandAuDays = units * herd.feedingSeasonDays;
	const grazingDayLimit = Math.min(herd.feedingSeasonDays, herd.maxGrazingDays ?? Infinity);
	const grazingAuDays = Math.min(grazingAuDaysOffered, units * grazingDayLimit);
	const grazingDays = units > 0 ? grazingAuDays / units : 0;
	const hayFeedingDays = units > 0 ? herd.feedingSeasonDays - grazingDays : 0;
	const hayDmLb = (herdDemandAuDays - grazingAuDays) * herd.intakeLbDmPerAuDay;
	const choreHoursByMonth = new Array<number>(12).fill(0);
	addChoreHours(
		choreHoursByMonth,
		herd.feedingSeasonStartMonth,
		0,
		grazingDays,
		herd.choreHoursPerDayGrazing
	);
	addChoreHours(
		choreHoursByMonth,
		herd.feedingSeasonStartMonth,
		grazingDays,
		hayFeedingDays,
		herd.choreHoursPerDayFeedingHay
	);
	return {
		animalUnits: units,
		herdDemandAuDays,
		grazingAuDaysOffered,
		grazingAuDays,
		grazingDays,
		hayFeedingDays,
		hayDmLb,
		hayBales: hayBales(
			hayDmLb,
			herd.baleWeightLb,
			herd.baleDryMatterPercent,
			herd.feedingWastePercent
		),
		hayBalesAvoided: hayBales(
			grazingAuDays * herd.intakeLbDmPerAuDay,
			herd.baleWeightLb,
			herd.baleDryMatterPercent,
			herd.feedingWastePercent
		),
		choreHours:
			grazingDays * herd.choreHoursPerDayGrazing + hayFeedingDays * herd.choreHoursPerDayFeedingHay,
		choreHoursByMonth
	};
}
