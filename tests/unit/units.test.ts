import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { create, createUnitDependencies, unitDependencies } from 'mathjs';
import { builtInCrops } from '../../src/lib/schemas/crops';
import {
	kgPerHaToSaleUnitsPerAcre,
	quantityUnits,
	saleUnitsPerAcreToKgPerHa,
	saleUnitsToTonnes,
	squareFeetPerAcre,
	toMetric,
	toUs,
	tonnesToSaleUnits,
	hectaresPerAcre,
	kgPerHaPerLbPerAcre,
	kgPerLb,
	feetPerMile,
	inchesPerFoot,
	metresPerFoot,
	poundsPerTon,
	litresPerGallon,
	litresPerHaPerGallonPerAcre,
	kwPerHp,
	kmhPerMph,
	tonnesPerHaPerTonPerAcre,
	type Quantity
} from '../../src/lib/engine/units';

const lbPerBushel = new Map(builtInCrops.map((c) => [c.id, c.lbPerUnit]));
const bushel = (crop: string) => lbPerBushel.get(crop)!;

describe('bushels by crop weight', () => {
	it('uses the legal bushel weights for the built-in grains', () => {
		// Univ. of Missouri G4020 / FCIC-25010: corn 56, soybean 60, wheat 60, oats 32, barley 48, rye 56 lb/bu
		const grains = builtInCrops.filter((c) => c.soldBy === 'bu');
		expect(Object.fromEntries(grains.map((c) => [c.id, c.lbPerUnit]))).toEqual({
			corn: 56,
			soybean: 60,
			wheat: 60,
			oats: 32,
			barley: 48,
			rye: 56
		});
	});

	it('converts bushels to tonnes', () => {
		// Minnesota shippers conversion table: 1 bu corn = 0.025401 t; soybean/wheat 0.027216; barley 0.021772
		expect(saleUnitsToTonnes(1, bushel('corn'))).toBeCloseTo(0.025401, 6);
		expect(saleUnitsToTonnes(1, bushel('soybean'))).toBeCloseTo(0.027216, 6);
		expect(saleUnitsToTonnes(1, bushel('wheat'))).toBeCloseTo(0.027216, 6);
		expect(saleUnitsToTonnes(1, bushel('barley'))).toBeCloseTo(0.021772, 6);
		expect(tonnesToSaleUnits(0.025401, bushel('corn'))).toBeCloseTo(1, 4);
		// a hundredweight is 100 lb: 1 cwt = 0.0453592 t (NIST Handbook 44: 1 lb = 0.45359237 kg)
		expect(saleUnitsToTonnes(1, 100)).toBeCloseTo(0.0453592, 7);
	});

	it('converts bu/ac to kg/ha', () => {
		// NDSU ProCrop metric card: 60-lb bu/ac × 67.25; 48-lb 53.80; 32-lb 35.87 kg/ha
		expect(saleUnitsPerAcreToKgPerHa(1, bushel('soybean'))).toBeCloseTo(67.25, 2);
		expect(saleUnitsPerAcreToKgPerHa(1, bushel('barley'))).toBeCloseTo(53.8, 2);
		expect(saleUnitsPerAcreToKgPerHa(1, bushel('oats'))).toBeCloseTo(35.87, 2);
		// NDSU card prints 62.723 for 56-lb bushels (a misprint); exact 62.768, Minnesota shippers 0.06277 t/ha
		expect(saleUnitsPerAcreToKgPerHa(1, bushel('corn'))).toBeCloseTo(62.77, 2);
		expect(kgPerHaToSaleUnitsPerAcre(62.768, bushel('corn'))).toBeCloseTo(1, 4);
	});
});

describe('metric conversions', () => {
	it('gives every factor as mathjs’s units work it out', () => {
		// mathjs (an independent units library) as the reference. Its built-in `acre` is rounded to
		// 4046.86 m², so the check defines the acre of 43,560 ft² itself; its `hp` is 745.6998715386 W,
		// rounded in the tenth figure from the exact 745.699871582… W, hence agreement to 1 in 10⁹.
		const math = create({ unitDependencies, createUnitDependencies });
		math.createUnit('acreExact', '43560 ft^2');
		const factor = (from: string, to: string) => math.unit(1, from).toNumber(to);
		const factors: [number, string, string][] = [
			[squareFeetPerAcre, 'acreExact', 'ft^2'],
			[feetPerMile, 'mi', 'ft'],
			[inchesPerFoot, 'ft', 'inch'],
			[poundsPerTon, 'ton', 'lb'],
			[hectaresPerAcre, 'acreExact', 'hectare'],
			[kgPerLb, 'lb', 'kg'],
			[litresPerGallon, 'gal', 'L'],
			[kwPerHp, 'hp', 'kW'],
			[kmhPerMph, 'mi/h', 'km/h'],
			[metresPerFoot, 'ft', 'm'],
			[kgPerHaPerLbPerAcre, 'lb/acreExact', 'kg/hectare'],
			[litresPerHaPerGallonPerAcre, 'gal/acreExact', 'L/hectare'],
			[tonnesPerHaPerTonPerAcre, 'ton/acreExact', 'tonne/hectare']
		];
		for (const [ours, from, to] of factors) {
			const reference = factor(from, to);
			expect(Math.abs(ours - reference) / reference, `${from} in ${to}`).toBeLessThan(1e-9);
		}
	});

	it('matches the NDSU metric conversion card', () => {
		// NDSU metric card: 1 acre = 43,560 ft² = 0.40468564 ha
		expect(squareFeetPerAcre).toBe(43560);
		expect(hectaresPerAcre).toBeCloseTo(0.40468564, 8);
		// NDSU metric card: lb/ac × 1.12085 = kg/ha
		expect(kgPerHaPerLbPerAcre).toBeCloseTo(1.12085, 5);
		// NDSU metric card: US gallon 3.7854 L; gal/ac × 9.3541 = L/ha
		expect(litresPerGallon).toBeCloseTo(3.785411784, 9);
		expect(litresPerHaPerGallonPerAcre).toBeCloseTo(9.354, 3);
		// NDSU metric card: hp × 0.7457 = kW; mph × 1.609344 = km/h; ton/ac × 2.2417 = t/ha
		expect(kwPerHp).toBeCloseTo(0.7457, 4);
		expect(kmhPerMph).toBeCloseTo(1.609344, 6);
		expect(tonnesPerHaPerTonPerAcre).toBeCloseTo(2.2417, 4);
	});

	it('round-trips metric → US → metric for every quantity', () => {
		const quantities = Object.keys(quantityUnits) as Quantity[];
		fc.assert(
			fc.property(
				fc.constantFrom(...quantities),
				fc.double({ min: 0, max: 1e7, noNaN: true }),
				(quantity, metricValue) => {
					const back = toMetric(toUs(metricValue, quantity), quantity);
					expect(back).toBeCloseTo(metricValue, 6);
				}
			)
		);
	});

	it('round-trips bushels per acre through kg/ha', () => {
		fc.assert(
			fc.property(
				fc.constantFrom(...builtInCrops.map((c) => c.lbPerUnit)),
				fc.double({ min: 0, max: 20000, noNaN: true }),
				(lbPerUnit, kgPerHa) => {
					expect(
						saleUnitsPerAcreToKgPerHa(kgPerHaToSaleUnitsPerAcre(kgPerHa, lbPerUnit), lbPerUnit)
					).toBeCloseTo(kgPerHa, 8);
				}
			)
		);
	});
});
