import type { FieldOperation } from './schemas/plan-file';

/**
 * The catalogue of common field operations a farm can copy and then adjust to its own machines. Each is
 * a plan-file operation with the published table it comes from. Speeds, widths and efficiencies give
 * field capacity by ASABE D497 (ac/h = mph × ft × efficiency ÷ 8.25).
 *
 * Where the values come from (see shared REFERENCE-VALUES §1–3):
 * - ISU A3-24 Table 1 / ISU PM 696 rows: speed, width and efficiency as published (read).
 * - ASABE D497 Table 3: the typical speed and field efficiency of the machine (from memory); the width is
 *   a common size (from memory).
 * - Diesel: Univ. of Missouri G1208 Table 1 and Univ. of Nebraska CropWatch (read); Purdue (Dobbins 2006,
 *   farm-press copy) for combining; ISU PM 709 where only that table has the pass (from memory).
 * - Labour factor 1.1 × machine hours: Univ. of Illinois farmdoc tractor cost table (read).
 * - Repairs $/ac: no table in the reference values states repairs per acre; these are from memory and
 *   every farm should put in its own.
 * Custom (hired) operations cost the price set's custom rate, so they state no machine.
 */
export type OperationDefault = FieldOperation & { source: string };

const labourFactor = 1.1;
const repairsFromMemory = 'repairs from memory';

const machine = (
	op: Omit<
		Extract<FieldOperation, { statedAs: 'machine' }>,
		'by' | 'statedAs' | 'fuel' | 'labourFactor'
	> & {
		dieselGallonsPerAcre: number;
		source: string;
	}
): OperationDefault => {
	const { dieselGallonsPerAcre, ...rest } = op;
	return {
		...rest,
		by: 'own',
		statedAs: 'machine',
		fuel: { basis: 'per-acre', dieselGallonsPerAcre },
		labourFactor
	};
};

export const operationDefaults: readonly OperationDefault[] = [
	machine({
		id: 'moldboard-plow',
		name: 'Moldboard plow, 7 bottoms × 16 in',
		month: 10,
		speedMph: 5,
		widthFt: 9.33,
		fieldEfficiencyPercent: 85,
		dieselGallonsPerAcre: 1.68,
		repairsUsdPerAcre: 4,
		source: `ISU PM 696 (7-16 in plow: 5 mph, 85 %, 4.8 ac/h); Univ. of Missouri G1208 diesel (8 in deep); ${repairsFromMemory}`
	}),
	machine({
		id: 'chisel-plow',
		name: 'Chisel plow, 13 ft 9 in',
		month: 10,
		speedMph: 5.5,
		widthFt: 13.75,
		fieldEfficiencyPercent: 85,
		dieselGallonsPerAcre: 1.1,
		repairsUsdPerAcre: 3,
		source: `ISU PM 696 (13 ft 9 in chisel: 5.5 mph, 85 %, 7.8 ac/h); Univ. of Missouri G1208 diesel (8 in deep); ${repairsFromMemory}`
	}),
	machine({
		id: 'tandem-disk',
		name: 'Tandem disk, 24 ft, on corn stalks',
		month: 4,
		speedMph: 6,
		widthFt: 24,
		fieldEfficiencyPercent: 80,
		dieselGallonsPerAcre: 0.45,
		repairsUsdPerAcre: 2,
		source: `ASABE D497 Table 3 typical speed and efficiency (from memory), width from memory; Univ. of Missouri G1208 diesel (disk on corn stalks); ${repairsFromMemory}`
	}),
	machine({
		id: 'field-cultivator',
		name: 'Field cultivator, 30 ft',
		month: 4,
		speedMph: 7,
		widthFt: 30,
		fieldEfficiencyPercent: 85,
		dieselGallonsPerAcre: 0.6,
		repairsUsdPerAcre: 1.5,
		source: `ASABE D497 Table 3 typical speed and efficiency (from memory), width from memory; Univ. of Missouri G1208 diesel; ${repairsFromMemory}`
	}),
	machine({
		id: 'row-cultivator',
		name: 'Row-crop cultivator, 12 rows at 30 in',
		month: 6,
		speedMph: 5,
		widthFt: 30,
		fieldEfficiencyPercent: 80,
		dieselGallonsPerAcre: 0.45,
		repairsUsdPerAcre: 1.5,
		source: `ASABE D497 Table 3 typical speed and efficiency (from memory); Univ. of Missouri G1208 diesel; ${repairsFromMemory}`
	}),
	machine({
		id: 'planter-30in',
		name: 'Planter, 12 rows at 30 in, tilled ground',
		month: 5,
		speedMph: 5.5,
		widthFt: 30,
		fieldEfficiencyPercent: 65,
		dieselGallonsPerAcre: 0.5,
		repairsUsdPerAcre: 4,
		source: `ASABE D497 Table 3 row-crop planter typical speed and efficiency (from memory); Univ. of Missouri G1208 diesel (conventional planter); ${repairsFromMemory}`
	}),
	machine({
		id: 'no-till-planter-30in',
		name: 'No-till planter, 12 rows at 30 in',
		month: 5,
		speedMph: 5.5,
		widthFt: 30,
		fieldEfficiencyPercent: 65,
		dieselGallonsPerAcre: 0.35,
		repairsUsdPerAcre: 4.5,
		source: `ASABE D497 Table 3 row-crop planter typical speed and efficiency (from memory; D497 has no no-till line); Univ. of Missouri G1208 diesel (no-till planter); ${repairsFromMemory}`
	}),
	machine({
		id: 'no-till-drill',
		name: 'No-till drill, 15 ft',
		month: 4,
		speedMph: 5,
		widthFt: 15,
		fieldEfficiencyPercent: 70,
		dieselGallonsPerAcre: 0.4,
		repairsUsdPerAcre: 3,
		source: `ASABE D497 Table 3 grain drill typical speed and efficiency (from memory), width from memory; ISU PM 709 diesel for a no-till drill (from memory); ${repairsFromMemory}`
	}),
	machine({
		id: 'interseeder',
		name: 'Interseeder into standing corn, 12 rows at 30 in',
		month: 6,
		speedMph: 5,
		widthFt: 30,
		fieldEfficiencyPercent: 70,
		dieselGallonsPerAcre: 0.35,
		repairsUsdPerAcre: 3,
		source: `ASABE D497 Table 3 grain drill typical speed and efficiency (from memory); diesel of the Univ. of Missouri G1208 no-till planter row, a pass of like draft (our judgement); ${repairsFromMemory}`
	}),
	machine({
		id: 'broadcast-seeding',
		name: 'Broadcast cover-crop seeding, 60 ft spreader',
		month: 9,
		speedMph: 6,
		widthFt: 60,
		fieldEfficiencyPercent: 68,
		dieselGallonsPerAcre: 0.15,
		repairsUsdPerAcre: 1,
		source: `ISU A3-24 Table 1 (fertilizer spreader 60 ft: 6 mph, 68 %, 29.7 ac/h); diesel of an older Illinois no-till budget's broadcast pass via No-Till Farmer (low authority); ${repairsFromMemory}`
	}),
	machine({
		id: 'fertilizer-spreader',
		name: 'Fertilizer spreader, 60 ft (P, K, lime)',
		month: 11,
		speedMph: 6,
		widthFt: 60,
		fieldEfficiencyPercent: 68,
		dieselGallonsPerAcre: 0.15,
		repairsUsdPerAcre: 1,
		source: `ISU A3-24 Table 1 (fertilizer spreader 60 ft: 6 mph, 68 %, 29.7 ac/h); diesel of an older Illinois no-till budget's broadcast fertilizer pass via No-Till Farmer (low authority); ${repairsFromMemory}`
	}),
	machine({
		id: 'nh3-applicator',
		name: 'Anhydrous applicator, 15 knives at 30 in',
		month: 4,
		speedMph: 6,
		widthFt: 37.5,
		fieldEfficiencyPercent: 65,
		dieselGallonsPerAcre: 0.65,
		repairsUsdPerAcre: 2.5,
		source: `ISU A3-24 Table 1 (NH3 applicator, 15 knives: 6 mph, 65 %, 17.7 ac/h); Univ. of Missouri G1208 diesel; ${repairsFromMemory}`
	}),
	machine({
		id: 'boom-sprayer',
		name: 'Boom sprayer, 90 ft',
		month: 6,
		speedMph: 6.5,
		widthFt: 90,
		fieldEfficiencyPercent: 65,
		dieselGallonsPerAcre: 0.11,
		repairsUsdPerAcre: 0.75,
		source: `ASABE D497 Table 3 typical speed and efficiency (from memory), width from memory; Univ. of Nebraska CropWatch diesel per spray pass; ${repairsFromMemory}`
	}),
	machine({
		id: 'combine-corn',
		name: 'Combine, corn, 8-row 30 in head',
		month: 10,
		speedMph: 3,
		widthFt: 20,
		fieldEfficiencyPercent: 70,
		dieselGallonsPerAcre: 2.4,
		repairsUsdPerAcre: 12,
		source: `ASABE D497 Table 3 self-propelled combine typical speed and efficiency (from memory, least certain row); Purdue (Dobbins 2006) diesel for 165 bu/ac corn (farm-press copy); ${repairsFromMemory}`
	}),
	machine({
		id: 'combine-soybean',
		name: 'Combine, soybean, 25 ft platform',
		month: 10,
		speedMph: 3,
		widthFt: 25,
		fieldEfficiencyPercent: 70,
		dieselGallonsPerAcre: 2.02,
		repairsUsdPerAcre: 10,
		source: `ASABE D497 Table 3 self-propelled combine typical speed and efficiency (from memory, least certain row); Purdue (Dobbins 2006) diesel for soybeans (farm-press copy); ${repairsFromMemory}`
	}),
	machine({
		id: 'mower-conditioner',
		name: 'Disc mower-conditioner, 13 ft',
		month: 6,
		speedMph: 7,
		widthFt: 13,
		fieldEfficiencyPercent: 80,
		dieselGallonsPerAcre: 0.6,
		repairsUsdPerAcre: 3,
		source: `ASABE D497 Table 3 rotary/disc mower-conditioner typical speed and efficiency (from memory), width from memory; ISU PM 709 diesel (from memory); ${repairsFromMemory}`
	}),
	machine({
		id: 'wheel-rake',
		name: 'Wheel rake, 24 ft',
		month: 6,
		speedMph: 6,
		widthFt: 24,
		fieldEfficiencyPercent: 80,
		dieselGallonsPerAcre: 0.2,
		repairsUsdPerAcre: 0.75,
		source: `ASABE D497 Table 3 wheel rake typical speed and efficiency (from memory), width from memory; ISU PM 709 diesel (from memory); ${repairsFromMemory}`
	}),
	machine({
		id: 'round-baler',
		name: 'Large round baler, 13 ft swath per windrow',
		month: 6,
		speedMph: 5,
		widthFt: 13,
		fieldEfficiencyPercent: 65,
		dieselGallonsPerAcre: 0.6,
		repairsUsdPerAcre: 4,
		source: `ASABE D497 Table 3 large round baler typical speed and efficiency (from memory), width = the mower's swath; ISU PM 709 diesel (from memory); ${repairsFromMemory}`
	}),
	{
		id: 'corn-silage-harvest',
		name: 'Corn silage harvest, per acre',
		by: 'own',
		statedAs: 'per-acre',
		month: 9,
		dieselGallonsPerAcre: 3.25,
		// ASABE D497 self-propelled forage harvester 3.5 mph, 70 % (from memory) with a 10 ft (4-row) head:
		// 2.97 ac/h → 0.34 machine h/ac; labour × 1.1 (farmdoc).
		machineHoursPerAcre: 0.34,
		labourHoursPerAcre: 0.37,
		repairsUsdPerAcre: 0,
		source:
			'ISU PM 710 diesel (example citing PM 709); hours from the ASABE D497 forage harvester row (from memory) with a 4-row head, labour × 1.1 (farmdoc); repairs: enter your own'
	},
	{
		id: 'custom-combining',
		name: 'Custom combining (hired)',
		by: 'custom',
		month: 10,
		source: "Hired: costs the price set's custom rate per acre; no own machine, diesel or labour"
	}
];

/** The catalogue by id (a copied operation names its default by this id). */
export const operationDefaultsById: ReadonlyMap<string, OperationDefault> = new Map(
	operationDefaults.map((op) => [op.id, op])
);
