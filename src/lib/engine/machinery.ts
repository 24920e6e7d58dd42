import { feetPerMile, squareFeetPerAcre } from './units';

/**
 * ASABE D497 (as used in ISU Ag Decision Maker A3-24): effective field capacity, ac/h =
 * speed (mph) × width (ft) × field efficiency ÷ 8.25, where 8.25 = 43,560 ft²/ac ÷ 5,280 ft/mi.
 */
const mphTimesFtPerAcrePerHour = squareFeetPerAcre / feetPerMile;

export function fieldCapacityAcresPerHour(
	speedMph: number,
	widthFt: number,
	fieldEfficiencyPercent: number
): number {
	return (speedMph * widthFt * (fieldEfficiencyPercent / 100)) / mphTimesFtPerAcrePerHour;
}

/** ISU A3-29 (from ASAE D497): diesel gal/h = coefficient (0.044) × maximum PTO hp, a year-round average. */
export function dieselGallonsPerHourFromPto(maxPtoHp: number, gallonsPerHpHour: number): number {
	return gallonsPerHpHour * maxPtoHp;
}

export interface OperationTotals {
	fieldCapacityAcresPerHour: number | null;
	machineHours: number;
	labourHours: number;
	dieselGallons: number;
	fuelUsd: number;
	repairsUsd: number;
	labourUsd: number;
	customHireUsd: number;
}

export interface OwnMachine {
	speedMph: number;
	widthFt: number;
	fieldEfficiencyPercent: number;
	fuel:
		| { basis: 'per-acre'; dieselGallonsPerAcre: number }
		| { basis: 'pto-power'; tractorMaxPtoHp: number; dieselGallonsPerHpHour: number };
	labourFactor: number;
	repairsUsdPerAcre: number;
}

/** Hours, diesel and costs of running one's own machine over `acresCovered` (acres × passes). */
export function ownOperationTotals(
	machine: OwnMachine,
	acresCovered: number,
	dieselUsdPerGallon: number,
	labourUsdPerHour: number
): OperationTotals {
	const capacity = fieldCapacityAcresPerHour(
		machine.speedMph,
		machine.widthFt,
		machine.fieldEfficiencyPercent
	);
	const machineHours = acresCovered / capacity;
	// farmdoc: labour hours = machine hours × labour factor (1.1), for travel, servicing and set-up.
	const labourHours = machineHours * machine.labourFactor;
	const dieselGallons =
		machine.fuel.basis === 'per-acre'
			? machine.fuel.dieselGallonsPerAcre * acresCovered
			: dieselGallonsPerHourFromPto(
					machine.fuel.tractorMaxPtoHp,
					machine.fuel.dieselGallonsPerHpHour
				) * machineHours;
	return {
		fieldCapacityAcresPerHour: capacity,
		machineHours,
		labourHours,
		dieselGallons,
		fuelUsd: dieselGallons * dieselUsdPerGallon,
		repairsUsd: machine.repairsUsdPerAcre * acresCovered,
		labourUsd: labourHours * labourUsdPerHour,
		customHireUsd: 0
	};
}

export interface OwnPerAcreRates {
	dieselGallonsPerAcre: number;
	machineHoursPerAcre: number;
	labourHoursPerAcre: number;
	repairsUsdPerAcre: number;
}

/**
 * An own operation stated by published per-acre rates (fuel tables such as Univ. of Missouri G1208
 * give gal/ac directly): each total is the rate × acres covered, with no capacity or hours derived.
 */
export function perAcreOperationTotals(
	rates: OwnPerAcreRates,
	acresCovered: number,
	dieselUsdPerGallon: number,
	labourUsdPerHour: number
): OperationTotals {
	const dieselGallons = rates.dieselGallonsPerAcre * acresCovered;
	const labourHours = rates.labourHoursPerAcre * acresCovered;
	return {
		fieldCapacityAcresPerHour: null,
		machineHours: rates.machineHoursPerAcre * acresCovered,
		labourHours,
		dieselGallons,
		fuelUsd: dieselGallons * dieselUsdPerGallon,
		repairsUsd: rates.repairsUsdPerAcre * acresCovered,
		labourUsd: labourHours * labourUsdPerHour,
		customHireUsd: 0
	};
}

/** A hired operation costs the custom rate per acre; the operator's own hours and fuel are not the farm's. */
export function customOperationTotals(
	acresCovered: number,
	rateUsdPerAcre: number
): OperationTotals {
	return {
		fieldCapacityAcresPerHour: null,
		machineHours: 0,
		labourHours: 0,
		dieselGallons: 0,
		fuelUsd: 0,
		repairsUsd: 0,
		labourUsd: 0,
		customHireUsd: rateUsdPerAcre * acresCovered
	};
}
