import { describe, expect, it } from 'vitest';
import { builtInCrops } from '../../src/lib/schemas/crops';
import { displayUnits } from '../../src/lib/server/display-units';

const crop = (id: string) => builtInCrops.find((c) => c.id === id)!;

const us = displayUnits('us');
const metric = displayUnits('metric');

describe('showing stored US values in the farm’s units', () => {
	it('leaves US customary values as they are', () => {
		expect(us.amount(52, 'area')).toBe(52);
		expect(us.unit('area')).toBe('ac');
		expect(us.yieldPerArea(180, crop('corn'))).toEqual({ value: 180, unit: 'bu/ac' });
		expect(us.cropPrice(4.4, crop('corn'))).toEqual({ value: 4.4, unit: 'bu' });
		expect(us.yieldPerArea(3, crop('hay'))).toEqual({ value: 3, unit: 'ton/ac' });
	});

	it('converts area, mass and speed with the NDSU metric card factors', () => {
		// NDSU ProCrop metric card: 1 ac = 0.40468564 ha; 1 lb = 0.4536 kg; 1 mph = 1.609 km/h
		expect(metric.amount(52, 'area')).toBeCloseTo(52 * 0.40468564, 6);
		expect(metric.unit('area')).toBe('ha');
		expect(metric.amount(1350, 'mass')).toBeCloseTo(612.35, 2);
		expect(metric.amount(5, 'speed')).toBeCloseTo(8.047, 3);
	});

	it('turns prices per US unit into prices per metric unit', () => {
		// $0.55/lb N ÷ 0.45359237 kg/lb = $1.2125/kg; $3.60/gal ÷ 3.785411784 L/gal = $0.951/L
		expect(metric.pricePer(0.55, 'mass')).toBeCloseTo(1.2125, 4);
		expect(metric.pricePer(3.6, 'volume')).toBeCloseTo(0.951, 3);
		// $20/ac ÷ 0.40468564 ha/ac = $49.42/ha
		expect(metric.pricePer(20, 'area')).toBeCloseTo(49.42, 2);
	});

	it('shows grain yields and prices by the crop’s bushel weight', () => {
		// NDSU card: 1 bu/ac of 56-lb corn = 62.77 kg/ha, so 180 bu/ac = 11.30 t/ha
		expect(metric.yieldPerArea(180, crop('corn')).value).toBeCloseTo(11.298, 3);
		// 60-lb soybean: 67.25 kg/ha per bu/ac
		expect(metric.yieldPerArea(58, crop('soybean')).value).toBeCloseTo(3.9, 2);
		// Minnesota shippers table: 1 bu corn = 0.025401 t, so $4.40/bu = $173.22/t
		expect(metric.cropPrice(4.4, crop('corn'))).toEqual({
			value: expect.closeTo(173.22, 2),
			unit: 't'
		});
		// NDSU card: 1 ton/ac = 2.2417 t/ha
		expect(metric.yieldPerArea(3, crop('oat-pea-forage')).value).toBeCloseTo(6.725, 3);
		// a crop of one's own sold by the hundredweight: 20 cwt/ac = 2,000 lb/ac × 1.12085 = 2,241.7 kg/ha
		const dryBeans = {
			...crop('soybean'),
			id: 'dry-beans',
			soldBy: 'cwt' as const,
			lbPerUnit: 100
		};
		expect(metric.yieldPerArea(20, dryBeans).value).toBeCloseTo(2.2417, 4);
		expect(us.yieldPerArea(20, dryBeans).unit).toBe('cwt/ac');
	});
});
