/** Hired help as the budgets use it: a wage and the hours the person can work in each month. */
export interface HiredHelp {
	wageUsdPerHour: number;
	hoursAvailableByMonth: number[];
}

export interface LabourAllocation {
	/** Hours hired help works in each month (Jan–Dec). */
	hiredHoursByMonth: number[];
	hiredHours: number;
	/** The wages of those hours. */
	hiredWagesUsd: number;
}

/**
 * Who does each month's work: the cheapest hands first, as a budget that charges the family's hours at
 * the labour rate and hired hours at their wage would choose (and as the optimiser's model does). The
 * family's hours cost the labour rate and stop at what the family has; hired help costs its wage and stops
 * at its hours; at equal cost the family works first. Work beyond everyone's hours stays a shortfall,
 * charged at the labour rate like the family's.
 */
export function allocateLabour(
	workHoursByMonth: number[],
	familyHoursByMonth: number[],
	hired: HiredHelp[],
	labourUsdPerHour: number
): LabourAllocation {
	const byWage = [...hired].sort((a, b) => a.wageUsdPerHour - b.wageUsdPerHour);
	const hiredHoursByMonth = new Array<number>(12).fill(0);
	let hiredWagesUsd = 0;
	for (let m = 0; m < 12; m++) {
		let left = workHoursByMonth[m];
		let familyLeft = familyHoursByMonth[m] ?? 0;
		for (const person of byWage) {
			if (left <= 0) break;
			// The family's hours come first while they are no dearer than this person's wage.
			if (person.wageUsdPerHour >= labourUsdPerHour && familyLeft > 0) {
				const family = Math.min(left, familyLeft);
				left -= family;
				familyLeft -= family;
				if (left <= 0) break;
			}
			const hours = Math.min(left, person.hoursAvailableByMonth[m] ?? 0);
			hiredHoursByMonth[m] += hours;
			hiredWagesUsd += hours * person.wageUsdPerHour;
			left -= hours;
		}
	}
	return {
		hiredHoursByMonth,
		hiredHours: hiredHoursByMonth.reduce((a, b) => a + b, 0),
		hiredWagesUsd
	};
}
