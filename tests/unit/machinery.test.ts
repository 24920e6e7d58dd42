import { describe, expect, it } from 'vitest';
import {
	customOperationTotals,
	dieselGallonsPerHourFromPto,
	fieldCapacityAcresPerHour,
	ownOperationTotals,
	type OwnMachine
} from '../../src/lib/engine/machinery';
import {
	hectaresPerAcre,
	kmhPerMph,
	kwPerHp,
	litresPerGallon,
	metresPerFoot
} from '../../src/lib/engine/units';

describe('effective field capacity (ASABE D497)', () => {
	it('reproduces the Buckmaster worked example', () => {
		// D. Buckmaster, Progressive Forage: 30 ft × 5 mph: theoretical 18.2 ac/h; 80 % → 14.5; 60 % → 10.9 ac/h
		expect(fieldCapacityAcresPerHour(5, 30, 100)).toBeCloseTo(18.2, 1);
		expect(fieldCapacityAcresPerHour(5, 30, 80)).toBeCloseTo(14.5, 1);
		expect(fieldCapacityAcresPerHour(5, 30, 60)).toBeCloseTo(10.9, 1);
	});

	it('agrees with the metric form Ca = v × w × eff ÷ 10', () => {
		// Srivastava et al. (2006) eq. 15.1 and Buckmaster: 30 ft × 5 mph × 80 % = 5.89 ha/h
		const haPerHour = fieldCapacityAcresPerHour(5, 30, 80) * hectaresPerAcre;
		expect(haPerHour).toBeCloseTo(5.89, 2);
		expect(haPerHour).toBeCloseTo((5 * kmhPerMph * 30 * metresPerFoot * 0.8) / 10, 9);
	});

	it.each([
		// ISU A3-24 Table 1 rows: [machine, width ft, mph, efficiency %, published ac/h]
		['fertilizer spreader', 40, 6, 70, 20.4],
		['fertilizer spreader', 60, 6, 68, 29.7],
		['fertilizer spreader', 60, 12, 68, 59.3],
		['fertilizer spreader', 80, 6, 68, 39.6],
		['fertilizer spreader', 80, 12, 68, 79.1],
		['manure spreader', 15, 5, 63, 5.7],
		['manure spreader', 20, 6, 63, 9.2],
		['manure spreader', 30, 6, 60, 13.1],
		['manure spreader', 45, 5, 60, 16.4],
		// ISU A3-24: NH3 applicators, 15/17/23 knives at 30-in spacing (spacing inferred)
		['NH3 applicator 15 knives', 37.5, 6, 65, 17.7],
		['NH3 applicator 17 knives', 42.5, 6, 63, 19.5],
		['NH3 applicator 23 knives', 57.5, 5, 63, 22.0],
		// ISU PM 696 (2001): chisel plows at 5.5 mph; moldboard 7-16 in at 5 mph, 85 %
		['chisel plow 13 ft 9 in', 13.75, 5.5, 85, 7.8],
		['chisel plow 16 ft 3 in', 16.25, 5.5, 83, 9.0],
		['moldboard plow 7-16', (7 * 16) / 12, 5, 85, 4.8]
	])('ISU row: %s %s ft at %s mph, %s %% → %s ac/h', (_machine, widthFt, mph, eff, published) => {
		expect(fieldCapacityAcresPerHour(mph, widthFt, eff)).toBeCloseTo(published, 1);
	});
});

describe('fuel from PTO power', () => {
	it('uses 0.044 gal/h per max PTO hp', () => {
		// ISU PM 710 / A3-29: 180 hp diesel tractor × 0.044 = 7.92 gal/h (29.98 L/h)
		expect(dieselGallonsPerHourFromPto(180, 0.044)).toBeCloseTo(7.92, 6);
		expect(dieselGallonsPerHourFromPto(180, 0.044) * litresPerGallon).toBeCloseTo(29.98, 2);
	});

	it('matches the metric coefficient 0.223 L/h per kW', () => {
		// Grisso (Virginia Tech), quoting ASAE EP496.3: 0.223 L/(kW h) = 0.044 gal/(hp h)
		expect((0.044 * litresPerGallon) / kwPerHp).toBeCloseTo(0.223, 3);
	});
});

describe('operation totals', () => {
	const planter: OwnMachine = {
		speedMph: 5,
		widthFt: 30,
		fieldEfficiencyPercent: 80,
		fuel: { basis: 'pto-power', tractorMaxPtoHp: 180, dieselGallonsPerHpHour: 0.044 },
		labourFactor: 1.1,
		repairsUsdPerAcre: 3
	};

	it('charges labour at machine hours × 1.1', () => {
		// farmdoc tractor cost table: $13.50/h × 1.1 = $14.85 per tractor hour
		const oneHour = fieldCapacityAcresPerHour(5, 30, 80);
		const totals = ownOperationTotals(planter, oneHour, 3.5, 13.5);
		expect(totals.machineHours).toBeCloseTo(1, 12);
		expect(totals.labourHours).toBeCloseTo(1.1, 12);
		expect(totals.labourUsd).toBeCloseTo(14.85, 10);
		// ISU A3-29: 180 hp × 0.044 = 7.92 gal in that hour
		expect(totals.dieselGallons).toBeCloseTo(7.92, 10);
		expect(totals.fuelUsd).toBeCloseTo(7.92 * 3.5, 10);
	});

	it('takes diesel per acre when the operation states it', () => {
		// Univ. of Missouri G1208: no-till planter 0.35 gal/ac
		const totals = ownOperationTotals(
			{ ...planter, fuel: { basis: 'per-acre', dieselGallonsPerAcre: 0.35 } },
			100,
			3.5,
			13.5
		);
		expect(totals.dieselGallons).toBeCloseTo(35, 10);
		expect(totals.repairsUsd).toBe(300);
		expect(totals.machineHours).toBeCloseTo(100 / 14.545454, 4);
	});

	it('charges a custom operation the rate per acre and no own hours', () => {
		// farmdoc daily (6):126, 2016: drilling cereal rye into stalks, custom $13.10/ac
		const totals = customOperationTotals(100, 13.1);
		expect(totals.customHireUsd).toBeCloseTo(1310, 9);
		expect(totals.machineHours + totals.labourHours + totals.dieselGallons).toBe(0);
	});
});
