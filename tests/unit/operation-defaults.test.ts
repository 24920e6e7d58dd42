// The catalogue of default operations: each parses as a plan-file operation, and its capacity, speed,
// efficiency and diesel are those of the published table row its source names.
import { describe, expect, it } from 'vitest';
import { fieldCapacityAcresPerHour } from '../../src/lib/engine/machinery';
import { operationDefaults, operationDefaultsById } from '../../src/lib/operation-defaults';
import { fieldOperationSchema } from '../../src/lib/schemas/plan-file';

interface Row {
	/** The table the source must name. */
	cites: string[];
	/** Published effective field capacity, ac/h, to one decimal. */
	acresPerHour?: number;
	speedMph?: number;
	fieldEfficiencyPercent?: number;
	dieselGallonsPerAcre: number;
}

// Values typed from shared REFERENCE-VALUES §1–2 (the table rows, not the catalogue).
const rows = new Map<string, Row>([
	// ISU PM 696: moldboard plow 7-16 in, 5 mph, 85 % → 4.8 ac/h; G1208 moldboard 8 in: 1.68 gal/ac
	['moldboard-plow', { cites: ['PM 696', 'G1208'], acresPerHour: 4.8, dieselGallonsPerAcre: 1.68 }],
	// ISU PM 696: chisel 13 ft 9 in, 5.5 mph, 85 % → 7.8 ac/h; G1208 chisel 8 in: 1.10 gal/ac
	['chisel-plow', { cites: ['PM 696', 'G1208'], acresPerHour: 7.8, dieselGallonsPerAcre: 1.1 }],
	// D497 Table 3 tandem disk [6.0 mph, 80 %] (from memory); G1208 disk on corn stalks 0.45 gal/ac
	[
		'tandem-disk',
		{
			cites: ['D497', 'G1208'],
			speedMph: 6,
			fieldEfficiencyPercent: 80,
			dieselGallonsPerAcre: 0.45
		}
	],
	// D497 field cultivator [7.0 mph, 85 %] (from memory); G1208 field cultivator 0.60 gal/ac
	[
		'field-cultivator',
		{ cites: ['D497', 'G1208'], speedMph: 7, fieldEfficiencyPercent: 85, dieselGallonsPerAcre: 0.6 }
	],
	// D497 row-crop cultivator [5.0 mph, 80 %] (from memory); G1208 row-crop cultivator 0.45 gal/ac
	[
		'row-cultivator',
		{
			cites: ['D497', 'G1208'],
			speedMph: 5,
			fieldEfficiencyPercent: 80,
			dieselGallonsPerAcre: 0.45
		}
	],
	// D497 row-crop planter [5.5 mph, 65 %] (from memory); G1208 planter conventional 0.50 / no-till 0.35
	[
		'planter-30in',
		{
			cites: ['D497', 'G1208'],
			speedMph: 5.5,
			fieldEfficiencyPercent: 65,
			dieselGallonsPerAcre: 0.5
		}
	],
	[
		'no-till-planter-30in',
		{
			cites: ['D497', 'G1208'],
			speedMph: 5.5,
			fieldEfficiencyPercent: 65,
			dieselGallonsPerAcre: 0.35
		}
	],
	// D497 grain drill [5.0 mph, 70 %] (from memory); ISU PM 709 no-till drill ~0.4 gal/ac (from memory)
	[
		'no-till-drill',
		{
			cites: ['D497', 'PM 709'],
			speedMph: 5,
			fieldEfficiencyPercent: 70,
			dieselGallonsPerAcre: 0.4
		}
	],
	// D497 grain drill row (from memory); G1208 no-till planter 0.35 gal/ac
	[
		'interseeder',
		{
			cites: ['D497', 'G1208'],
			speedMph: 5,
			fieldEfficiencyPercent: 70,
			dieselGallonsPerAcre: 0.35
		}
	],
	// ISU A3-24 Table 1: fertilizer spreader 60 ft, 6 mph, 68 % → 29.7 ac/h; No-Till Farmer broadcast 0.15
	[
		'broadcast-seeding',
		{ cites: ['A3-24', 'No-Till Farmer'], acresPerHour: 29.7, dieselGallonsPerAcre: 0.15 }
	],
	[
		'fertilizer-spreader',
		{ cites: ['A3-24', 'No-Till Farmer'], acresPerHour: 29.7, dieselGallonsPerAcre: 0.15 }
	],
	// ISU A3-24 Table 1: NH3 applicator 15 knives, 6 mph, 65 % → 17.7 ac/h; G1208 anhydrous 0.65 gal/ac
	['nh3-applicator', { cites: ['A3-24', 'G1208'], acresPerHour: 17.7, dieselGallonsPerAcre: 0.65 }],
	// D497 boom sprayer [6.5 mph, 65 %] (from memory); UNL CropWatch spray about 0.11 gal/ac per pass
	[
		'boom-sprayer',
		{
			cites: ['D497', 'CropWatch'],
			speedMph: 6.5,
			fieldEfficiencyPercent: 65,
			dieselGallonsPerAcre: 0.11
		}
	],
	// D497 self-propelled combine [3.0 mph, 70 %] (from memory); Purdue (Dobbins): corn 2.4, soybean 2.02
	[
		'combine-corn',
		{
			cites: ['D497', 'Dobbins'],
			speedMph: 3,
			fieldEfficiencyPercent: 70,
			dieselGallonsPerAcre: 2.4
		}
	],
	[
		'combine-soybean',
		{
			cites: ['D497', 'Dobbins'],
			speedMph: 3,
			fieldEfficiencyPercent: 70,
			dieselGallonsPerAcre: 2.02
		}
	],
	// D497 disc mower-conditioner [7.0 mph, 80 %], wheel rake [6.0, 80], round baler [5.0, 65] (from
	// memory); ISU PM 709 mower-conditioner ~0.6, rake ~0.2, large round baler ~0.6 gal/ac (from memory)
	[
		'mower-conditioner',
		{
			cites: ['D497', 'PM 709'],
			speedMph: 7,
			fieldEfficiencyPercent: 80,
			dieselGallonsPerAcre: 0.6
		}
	],
	[
		'wheel-rake',
		{
			cites: ['D497', 'PM 709'],
			speedMph: 6,
			fieldEfficiencyPercent: 80,
			dieselGallonsPerAcre: 0.2
		}
	],
	[
		'round-baler',
		{
			cites: ['D497', 'PM 709'],
			speedMph: 5,
			fieldEfficiencyPercent: 65,
			dieselGallonsPerAcre: 0.6
		}
	],
	// ISU PM 710 (citing PM 709): corn silage harvest 3.25 gal/ac
	['corn-silage-harvest', { cites: ['PM 710'], dieselGallonsPerAcre: 3.25 }]
]);

describe('the catalogue of default operations', () => {
	it.each(operationDefaults.map((op) => [op.id, op] as const))(
		'%s parses as a plan-file operation and names a source',
		(_, { source, ...op }) => {
			expect(fieldOperationSchema.parse(op)).toEqual(op);
			expect(source.length).toBeGreaterThan(10);
		}
	);

	it('has one entry per id, and a reference row for every own operation', () => {
		expect(operationDefaultsById.size).toBe(operationDefaults.length);
		const own = operationDefaults.filter((op) => op.by === 'own').map((op) => op.id);
		expect(own.sort()).toEqual([...rows.keys()].sort());
	});

	it.each([...rows])('%s matches the table rows it cites', (id, row) => {
		const op = operationDefaultsById.get(id)!;
		for (const table of row.cites) expect(op.source).toContain(table);
		if (op.by !== 'own') throw new Error(`${id} is not an own operation`);
		if (op.statedAs === 'per-acre') {
			expect(op.dieselGallonsPerAcre).toBe(row.dieselGallonsPerAcre);
			return;
		}
		expect(op.fuel).toEqual({ basis: 'per-acre', dieselGallonsPerAcre: row.dieselGallonsPerAcre });
		// farmdoc tractor cost table: labour hours = 1.1 × machine hours
		expect(op.labourFactor).toBe(1.1);
		const capacity = fieldCapacityAcresPerHour(op.speedMph, op.widthFt, op.fieldEfficiencyPercent);
		if (row.acresPerHour !== undefined) expect(capacity).toBeCloseTo(row.acresPerHour, 1);
		if (row.speedMph !== undefined) expect(op.speedMph).toBe(row.speedMph);
		if (row.fieldEfficiencyPercent !== undefined) {
			expect(op.fieldEfficiencyPercent).toBe(row.fieldEfficiencyPercent);
		}
		// D497 Table 3 rows were recalled, not re-read (REFERENCE-VALUES §1b): the source must say so.
		if (row.cites.includes('D497')) expect(op.source).toContain('(from memory');
	});

	it('the 15-knife applicator reproduces the A3-24 row from its 30 in knife spacing', () => {
		// ISU A3-24 Table 1: 15 knives, 6 mph, 65 % → 17.7 ac/h (37.5 ft = 15 × 30 in, REFERENCE-VALUES §1a)
		const op = operationDefaultsById.get('nh3-applicator')!;
		expect(op.by === 'own' && op.statedAs === 'machine' && op.widthFt).toBe((15 * 30) / 12);
	});
});
