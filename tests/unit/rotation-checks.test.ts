import { describe, expect, it } from 'vitest';
import {
	checkRotation,
	creditLeftLbPerAcre,
	type RotationYear
} from '../../src/lib/engine/rotation-checks';

const corn = { id: 'corn', name: 'Corn', legume: false, soldBy: 'bu' };
const soybean = { id: 'soybean', name: 'Soybean', legume: true, soldBy: 'bu' };
const wheat = { id: 'wheat', name: 'Wheat', legume: false, soldBy: 'bu' };
const oatPea = { id: 'oat-pea-forage', name: 'Oat–pea forage', legume: false, soldBy: 'ton' };

const year = (
	practiceName: string,
	crop: RotationYear['crop'],
	more: Partial<RotationYear> = {}
): RotationYear => ({
	practiceName,
	crop,
	nitrogenAppliedLbPerAcre: 0,
	nitrogenCreditToNextCropLbPerAcre: 0,
	coverMix: null,
	...more
});

const fullNCorn = year('Corn, full N', corn, { nitrogenAppliedLbPerAcre: 170 });
const beans = year('Soybean', soybean);
const rules = (years: RotationYear[]) => checkRotation(years).map((w) => [w.year, w.rule]);

describe('rotation checks', () => {
	it('a corn–soybean rotation at a full rate raises nothing', () => {
		expect(checkRotation([fullNCorn, beans])).toEqual([]);
	});

	it('flags corn after corn, including continuous corn (its year follows itself)', () => {
		// Iowa MRTN: corn after corn 181 lb N/ac against 124 after soybean (ISU ICM; REFERENCE-VALUES §4a).
		expect(rules([fullNCorn, fullNCorn, beans])).toEqual([[2, 'corn-after-corn']]);
		expect(rules([fullNCorn])).toEqual([[1, 'corn-after-corn']]);
		expect(checkRotation([fullNCorn])[0].message).toContain('181 against 124');
	});

	it('flags the last year following the first: a rotation repeats', () => {
		expect(rules([fullNCorn, beans, fullNCorn])).toEqual([[1, 'corn-after-corn']]);
	});

	it('flags a grain crop after itself but not a forage crop after itself', () => {
		// Common practice, no published source: disease and pest carry-over in a crop after itself.
		expect(rules([fullNCorn, beans, beans])).toEqual([[3, 'same-crop']]);
		expect(rules([fullNCorn, year('Oat–pea', oatPea), year('Oat–pea again', oatPea)])).toEqual([]);
	});

	it('flags low-N corn that counts on a legume credit the year before does not leave', () => {
		// ISU PM 1714: 100–150 lb N/ac for corn after soybean; 90 lb with nothing before it is short.
		const lowN = year('Corn, 90 lb N after red clover', corn, { nitrogenAppliedLbPerAcre: 90 });
		expect(rules([lowN, beans])).toEqual([[1, 'corn-short-of-n']]);
		expect(checkRotation([lowN, beans])[0].message).toContain('gets 90 lb N/ac');
	});

	it('counts the legume cover credit the year before leaves: 90 lb after red clover is enough', () => {
		// SARE MCCP arithmetic: 2,000 lb DM red clover × 100 % legume × 2.5 % N × 70 % available = 35 lb N/ac.
		const redClover = {
			biomassLbDmPerAcre: 2000,
			legumeSharePercent: 100,
			legumeNitrogenPercent: 2.5,
			nitrogenAvailablePercent: 70,
			grazingUtilisationPercent: 0
		};
		const wheatClover = year('Wheat underseeded to red clover', wheat, {
			nitrogenAppliedLbPerAcre: 60,
			coverMix: redClover
		});
		expect(creditLeftLbPerAcre(wheatClover)).toBeCloseTo(35, 10);
		const lowN = year('Corn, 90 lb N', corn, { nitrogenAppliedLbPerAcre: 90 });
		expect(rules([lowN, beans, wheatClover])).toEqual([]);
		// Three quarters grazed, the cover leaves a quarter of its N: 90 + 8.75 < 100.
		const grazed = { ...wheatClover, coverMix: { ...redClover, grazingUtilisationPercent: 75 } };
		expect(rules([lowN, beans, grazed])).toEqual([[1, 'corn-short-of-n']]);
	});

	it('leaves an economic-optimum rate alone: it buys up to the optimum less credits', () => {
		const eonr = year('Corn at the EONR', corn, { nitrogenAppliedLbPerAcre: 'economic-optimum' });
		expect(rules([eonr, beans])).toEqual([]);
	});

	it('flags an N credit left to a legume', () => {
		// Common practice, no published source: a legume fixes its own N, so the credit is not used.
		const leaves = year('Oat–pea, then a cover', oatPea, { nitrogenCreditToNextCropLbPerAcre: 10 });
		expect(rules([fullNCorn, leaves, beans])).toEqual([[3, 'credit-to-legume']]);
		// Under 10 lb N/ac is not worth a warning (common practice, no published source).
		const little = { ...leaves, nitrogenCreditToNextCropLbPerAcre: 9 };
		expect(rules([fullNCorn, little, beans])).toEqual([]);
	});
});
