import { describe, expect, it } from 'vitest';
import {
	economicOptimumNLbPerAcre,
	grazingManureCreditLbPerAcre,
	legumeCoverCreditLbPerAcre,
	nitrogenPriceRatio,
	plateauJoinLbN,
	plateauYieldBuPerAcre,
	responseYieldBuPerAcre
} from '../../src/lib/engine/nitrogen';

// REFERENCE-VALUES §4b synthetic case (our arithmetic on the Fausti et al. 2017 EONR formula):
// Y = 100 + 1.0 N − 0.003 N² bu/ac
const synthetic = { interceptBuPerAcre: 100, linearBuPerLbN: 1.0, quadraticBuPerLbN2: 0.003 };

describe('economic optimum N rate', () => {
	it('solves the synthetic quadratic-plateau case', () => {
		// EONR = (1.0 − 0.10) / (2 × 0.003) = 150 lb N/ac; yield there 182.5 bu/ac
		expect(economicOptimumNLbPerAcre(synthetic, 0.1)).toBeCloseTo(150, 9);
		expect(responseYieldBuPerAcre(synthetic, 150)).toBeCloseTo(182.5, 9);
		// agronomic maximum (plateau join) b/(2c) = 166.7 lb N; 0.83 bu/ac more than at the EONR
		expect(plateauJoinLbN(synthetic)).toBeCloseTo(166.7, 1);
		expect(plateauYieldBuPerAcre(synthetic) - 182.5).toBeCloseTo(0.83, 2);
	});

	it('caps the rate at the plateau and keeps the yield flat above it', () => {
		// Cerrato & Blackmer (1990), from memory: yield is flat above the join point N0 = b/(2c)
		expect(economicOptimumNLbPerAcre(synthetic, 0)).toBeCloseTo(166.67, 2);
		expect(responseYieldBuPerAcre(synthetic, 250)).toBe(plateauYieldBuPerAcre(synthetic));
		expect(economicOptimumNLbPerAcre(synthetic, 2)).toBe(0);
	});

	it('forms the price ratio from $/lb N and $/bu', () => {
		// ISU ICM News, 13 Oct 2014: $0.50 per lb N ÷ $3.50 per bu = 0.14
		expect(nitrogenPriceRatio(0.5, 3.5)).toBeCloseTo(0.14, 2);
		// ISU ICM: ratio 0.10 at $0.35/lb N and $3.50/bu
		expect(nitrogenPriceRatio(0.35, 3.5)).toBeCloseTo(0.1, 12);
	});
});

describe('N credits', () => {
	it('credits a legume cover with biomass × %N ÷ 2', () => {
		// SARE MCCP arithmetic: 3,000 lb DM hairy vetch × 3.5 % = 105 lb N; incorporated → 52.5 lb N/ac
		expect(legumeCoverCreditLbPerAcre(3000, 100, 3.5, 50, 0)).toBeCloseTo(52.5, 10);
		// SARE MCCP: left on the surface in a cool climate, total / 4
		expect(legumeCoverCreditLbPerAcre(3000, 100, 3.5, 25, 0)).toBeCloseTo(26.25, 10);
	});

	it('counts only the legume share left ungrazed', () => {
		// SARE MCCP arithmetic on half the biomass: 52.5 lb × 50 % legume × (1 − 50 % grazed) = 13.125
		expect(legumeCoverCreditLbPerAcre(3000, 50, 3.5, 50, 50)).toBeCloseTo(13.125, 10);
	});

	it('credits grazing manure from AU-days, lb N per AU-day and availability', () => {
		// ASABE D384.2 Table 1.b beef cow ≈ 0.42 lb N/day (from memory): 50 AU-days × 0.42 × 25 %
		expect(grazingManureCreditLbPerAcre(50, 0.42, 25)).toBeCloseTo(5.25, 10);
	});
});
