import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { evaluatePlan } from '../../src/lib/engine';
import { parsePlanDocument, type PlanDocument } from '../../src/lib/schemas/plan-file';
import { oneCornFieldInput, smallPlanInput } from './fixtures';

function parse(input: unknown): PlanDocument {
	const result = parsePlanDocument(input);
	if (!result.ok) throw new Error(JSON.stringify(result.issues));
	return result.plan;
}

function issuesOf(input: unknown) {
	const result = parsePlanDocument(input);
	return result.ok ? [] : result.issues;
}

describe('crops of a farm’s own', () => {
	it('prices and names dry beans sold by the hundredweight from the crop list', () => {
		const input = oneCornFieldInput();
		input.crops = [{ id: 'dry-beans', name: 'Dry edible beans', soldBy: 'cwt', legume: true }];
		input.practices[0] = {
			...input.practices[0],
			id: 'beans',
			name: 'Pinto beans',
			crop: 'dry-beans',
			yieldGoalPerAcre: 22
		};
		input.rotations[0].practices = ['beans'];
		for (const set of input.priceSets) set.cropPricesUsdPerUnit = { 'dry-beans': 35 };
		const plan = parse(input);
		// a hundredweight is 100 lb by definition; no bushel weight is needed
		expect(plan.crops.find((c) => c.id === 'dry-beans')?.lbPerUnit).toBe(100);
		const [fy] = evaluatePlan(plan).fieldYears;
		expect(fy.yieldUnit).toBe('cwt');
		expect(fy.cropName).toBe('Dry edible beans');
		// 22 cwt/ac × 100 ac × $35/cwt
		expect(fy.revenueUsd).toBeCloseTo(22 * 100 * 35, 9);
	});

	it('needs no crop list for the built-in eight, and a listed crop replaces a built-in', () => {
		expect(parse(oneCornFieldInput()).crops.map((c) => c.id)).toEqual([
			'corn',
			'soybean',
			'wheat',
			'oats',
			'barley',
			'rye',
			'oat-pea-forage',
			'hay'
		]);
		const input = oneCornFieldInput();
		input.crops = [{ id: 'corn', name: 'Flint corn', soldBy: 'bu', lbPerUnit: 56 }];
		const [fy] = evaluatePlan(parse(input)).fieldYears;
		expect(fy.cropName).toBe('Flint corn');
	});

	it('refuses a bushel crop without its weight, a wrong fixed weight and a reserved id', () => {
		const input = oneCornFieldInput();
		input.crops = [
			{ id: 'flax', name: 'Flax', soldBy: 'bu' },
			{ id: 'alfalfa', name: 'Alfalfa', soldBy: 'ton', lbPerUnit: 1000 },
			{ id: 'herd', name: 'Herd', soldBy: 'lb' }
		];
		const issues = issuesOf(input);
		expect(issues.map((i) => i.path)).toEqual(
			expect.arrayContaining(['crops.0.lbPerUnit', 'crops.1.lbPerUnit', 'crops.2.id'])
		);
		expect(issues.find((i) => i.path === 'crops.0.lbPerUnit')?.message).toMatch(
			/pounds in one bushel/
		);
	});

	it('refuses an unknown crop and a missing price, naming the crop by its name', () => {
		const input = oneCornFieldInput();
		input.practices[0].crop = 'buckwheat';
		expect(issuesOf(input)).toContainEqual({
			path: 'practices.0.crop',
			message: expect.stringMatching(/Unknown crop "buckwheat"/)
		});
		const noPrice = oneCornFieldInput();
		noPrice.crops = [{ id: 'buckwheat', name: 'Buckwheat', soldBy: 'bu', lbPerUnit: 48 }];
		noPrice.practices[0].crop = 'buckwheat';
		expect(issuesOf(noPrice)).toContainEqual({
			path: 'priceSets.0.cropPricesUsdPerUnit.buckwheat',
			message: 'No price for Buckwheat (practice "corn")'
		});
	});

	it('grazes a residue only where the crop or the practice states its leaf and husk', () => {
		const input = oneCornFieldInput();
		input.herd = smallPlanInput().herd;
		input.practices[0].crop = 'wheat';
		input.practices[0].residueGrazing = {};
		for (const set of input.priceSets) set.cropPricesUsdPerUnit = { wheat: 6 };
		expect(issuesOf(input).map((i) => i.path)).toContain(
			'practices.0.residueGrazing.leafHuskLbDmPerUnit'
		);
		input.practices[0].residueGrazing = { leafHuskLbDmPerUnit: 10 };
		const [fy] = evaluatePlan(parse(input)).fieldYears;
		// 180 bu × 10 lb × 50 % utilisation (UNL default)
		expect(fy.forage.residueLbDmPerAcre).toBeCloseTo(900, 9);
	});
});

describe('partial budget by enterprise when one crop replaces another', () => {
	// The method of NDSU (Saxowsky, "Introduction to Partial Budgeting") and Purdue (Langemeier): when an
	// enterprise is replaced, all of its returns are reduced returns and all of its costs reduced costs,
	// and the new enterprise's returns and costs are added in full. Numbers invented for the check.
	function switchToSoybean() {
		const reference = oneCornFieldInput();
		reference.practices[0].seed = { seedId: 'corn-seed', seedsPerAcre: 32000 };
		reference.practices[0].chemicalsUsdPerAcre = 50;
		reference.practices[0].nitrogen = { appliedLbPerAcre: 150 };
		const plan = oneCornFieldInput();
		plan.practices[0] = {
			id: 'soy',
			name: 'Soybean',
			crop: 'soybean',
			yieldGoalPerAcre: 55,
			seed: { seedId: 'soy-seed', seedsPerAcre: 140000 },
			otherFertiliserUsdPerAcre: 0,
			chemicalsUsdPerAcre: 40,
			operatingInterestMonths: 0
		};
		plan.rotations[0].practices = ['soy'];
		for (const input of [reference, plan]) {
			for (const set of input.priceSets) {
				set.cropPricesUsdPerUnit = { corn: 4.5, soybean: 11 };
				set.seedPrices = {
					'corn-seed': { usdPerThousandSeeds: 3.5 },
					'soy-seed': { usdPerThousandSeeds: 0.45 }
				};
				set.nitrogenUsdPerLb = 0.6;
			}
		}
		plan.plan.name = 'Soybean instead';
		return evaluatePlan(parse(plan), parse(reference)).partialBudget!.years[0];
	}

	it('lists each crop’s returns and costs gross, one line per enterprise and category', () => {
		const year = switchToSoybean();
		const byItem = (lines: { item: string; amountUsd: number }[]) =>
			Object.fromEntries(lines.map((l) => [l.item, l.amountUsd]));
		// corn: 180 bu × $4.50 × 100 ac; seed 32 × $3.50; N 150 lb × $0.60; chemicals $50
		expect(byItem(year.lines.reducedReturns)).toEqual({ 'Corn: sales': 81000 });
		expect(byItem(year.lines.reducedCosts)).toEqual({
			'Corn: seed': expect.closeTo(11200, 6),
			'Corn: nitrogen fertiliser': expect.closeTo(9000, 6),
			'Corn: chemicals': 5000
		});
		// soybean: 55 bu × $11 × 100 ac; seed 140 × $0.45; chemicals $40
		expect(byItem(year.lines.addedReturns)).toEqual({ 'Soybean: sales': 60500 });
		expect(byItem(year.lines.addedCosts)).toEqual({
			'Soybean: seed': expect.closeTo(6300, 6),
			'Soybean: chemicals': 4000
		});
		expect(year.lines.addedCosts.map((l) => [l.enterprise, l.category])).toEqual([
			['soybean', 'seed'],
			['soybean', 'chemicals']
		]);
		// (60,500 + 25,200) − (10,300 + 81,000) = −5,600
		expect(year.netChangeUsd).toBeCloseTo(-5600, 6);
	});
});

describe('own operations stated by published per-acre rates', () => {
	it('gives exactly the published gallons of a no-till corn system and no invented hours', () => {
		const input = oneCornFieldInput();
		// Univ. of Missouri G1208: anhydrous applicator 0.65, no-till planter 0.35 gal/ac;
		// UNL CropWatch: spraying 0.11 gal/ac a pass; Purdue (Dobbins 2006): combining corn 2.4 gal/ac
		const passes: [string, number, number][] = [
			['nh3', 0.65, 1],
			['no-till-plant', 0.35, 1],
			['spray', 0.11, 2],
			['combine', 2.4, 1]
		];
		input.operations = passes.map(([id, gallons]) => ({
			id,
			name: id,
			by: 'own',
			statedAs: 'per-acre',
			month: 5,
			dieselGallonsPerAcre: gallons,
			machineHoursPerAcre: 0,
			labourHoursPerAcre: 0
		}));
		input.practices[0].operations = passes.map(([operationId, , n]) => ({
			operationId,
			passes: n
		}));
		const [fy] = evaluatePlan(parse(input)).fieldYears;
		// 0.65 + 0.35 + 2 × 0.11 + 2.4 = 3.62 gal/ac over 100 acres
		expect(fy.dieselGallons).toBeCloseTo(362, 9);
		expect(fy.machineHours).toBe(0);
		expect(fy.labourHours).toBe(0);
		expect(fy.operations.every((o) => o.fieldCapacityAcresPerHour === null)).toBe(true);
		expect(fy.operationCosts.repairsUsd).toBe(0);
	});

	it('takes stated machine and labour hours per acre as they are', () => {
		const input = oneCornFieldInput();
		input.operations = [
			{
				id: 'drill',
				name: 'Drill',
				by: 'own',
				statedAs: 'per-acre',
				month: 4,
				dieselGallonsPerAcre: 0.4,
				machineHoursPerAcre: 0.08,
				labourHoursPerAcre: 0.1,
				repairsUsdPerAcre: 3
			}
		];
		input.practices[0].operations = [{ operationId: 'drill' }];
		const [fy] = evaluatePlan(parse(input)).fieldYears;
		expect(fy.machineHours).toBeCloseTo(8, 12);
		expect(fy.labourHoursByMonth[3]).toBeCloseTo(10, 12);
		expect(fy.operationCosts.repairsUsd).toBeCloseTo(300, 12);
	});
});

describe('economic optimum N on the field’s own yield curve', () => {
	// REFERENCE-VALUES §4b synthetic curve Y = 100 + 1.0 N − 0.003 N², plateau 183.33 bu/ac, price ratio 0.10
	function field(productivityIndex: number, applied: number | 'economic-optimum') {
		const input = oneCornFieldInput();
		input.fields[0].productivityIndex = productivityIndex;
		input.practices[0].yieldGoalPerAcre = 100 + 1 / (4 * 0.003);
		input.practices[0].nitrogen = {
			appliedLbPerAcre: applied,
			response: { interceptBuPerAcre: 100, linearBuPerLbN: 1.0, quadraticBuPerLbN2: 0.003 }
		};
		for (const set of input.priceSets) {
			set.nitrogenUsdPerLb = 0.4;
			set.cropPricesUsdPerUnit = { corn: 4 };
		}
		return evaluatePlan(parse(input)).fieldYears[0];
	}

	it('meets the price ratio where the scaled yield’s slope equals it', () => {
		const fy = field(1.2, 'economic-optimum');
		// yield scale 1.2: slope 1.2 × (1 − 0.006 N) = 0.10 → N = (1 − 0.10/1.2) ÷ 0.006 = 152.78 lb N/ac
		expect(fy.nitrogen.economicOptimumLbPerAcre).toBeCloseTo((1 - 0.1 / 1.2) / 0.006, 9);
		expect(fy.nitrogen.agronomicMaximumLbPerAcre).toBeCloseTo(1 / 0.006, 9);
		// the last pound pays for itself: one more pound adds $0.40 of corn, within rounding
		const n = fy.nitrogen.economicOptimumLbPerAcre!;
		const marginalBu = field(1.2, n + 0.5).yieldPerAcre - field(1.2, n - 0.5).yieldPerAcre;
		expect(marginalBu * 4).toBeCloseTo(0.4, 4);
		// at productivity 1.00 it is the curve's own optimum, (1.0 − 0.10)/(2 × 0.003) = 150
		expect(field(1, 'economic-optimum').nitrogen.economicOptimumLbPerAcre).toBeCloseTo(150, 9);
	});
});

describe('N credits follow the forage eaten', () => {
	function grazedCover(head: number) {
		const input = oneCornFieldInput();
		input.herd = {
			...smallPlanInput().herd!,
			head,
			averageWeightLb: 1000,
			feedingSeasonDays: 30,
			manureNitrogenAvailablePercent: 50
		};
		input.practices[0].coverMix = {
			species: [{ seedId: 'rye', lbPerAcre: 30 }],
			biomassLbDmPerAcre: 2600,
			legumeSharePercent: 100,
			grazingUtilisationPercent: 50
		};
		for (const set of input.priceSets) set.seedPrices = { rye: { usdPerLb: 0.3 } };
		return evaluatePlan(parse(input)).fieldYears;
	}

	it('shares the herd’s grazing over what was offered, and credits only what was eaten', () => {
		// 100 ac × 2,600 lb × 50 % = 130,000 lb DM = 5,000 AU-days offered at 26 lb (SRM); 50 AU × 30 days eat 1,500
		const [first, second] = grazedCover(50);
		expect(first.forage.grazingAuDays).toBeCloseTo(5000, 9);
		expect(first.forage.eatenAuDays).toBeCloseTo(1500, 9);
		// manure: 15 AU-days/ac × 0.42 lb N (ASABE D384.2, from memory) × 50 % available
		expect(second.nitrogen.manureCreditLbPerAcre).toBeCloseTo(15 * 0.42 * 0.5, 9);
		// cover: the herd ate 30 % of what was offered, so 15 % of the biomass; SARE: × 3.5 % N × 50 %
		expect(second.nitrogen.coverCreditLbPerAcre).toBeCloseTo(2600 * 0.85 * 0.035 * 0.5, 9);
	});

	it('gives no manure and no grazed share for a herd of 0 head', () => {
		const [, second] = grazedCover(0);
		expect(second.nitrogen.manureCreditLbPerAcre).toBe(0);
		expect(second.nitrogen.coverCreditLbPerAcre).toBeCloseTo(2600 * 0.035 * 0.5, 9);
	});
});

describe('format 1 is still read', () => {
	it('reads a format-1 file into the same document as its format-2 upgrade', () => {
		for (const [v1, v2] of [
			['tests/unit/plans/format-1-reference.json', 'scenarios/reference.json'],
			['tests/unit/plans/format-1-wide-row.json', 'scenarios/wide-row-interseeded.json']
		]) {
			const old = JSON.parse(readFileSync(v1, 'utf8'));
			const current = JSON.parse(readFileSync(v2, 'utf8'));
			// The demo scenarios have since rented some fields (and so carry less fixed cost): taken out
			// here, they are the files the format-1 copies were made from.
			current.farm.fixedCostsUsdPerYear = old.farm.fixedCostsUsdPerYear;
			for (const field of current.fields) {
				delete field.tenure;
				delete field.cashRentUsdPerAcre;
			}
			// The wide-row corn has since bought its N at the economic optimum, with assumptions saying
			// so: its name, N rate and the plan's assumptions are put back as the copy has them.
			for (const practice of current.practices) {
				const before = old.practices.find((p: { id: string }) => p.id === practice.id);
				practice.name = before.name;
				practice.nitrogen.appliedLbPerAcre = before.nitrogen.appliedLbPerAcre;
			}
			current.plan.assumptions = old.plan.assumptions;
			const first = parsePlanDocument(old);
			const second = parsePlanDocument(current);
			expect(first.ok && first.readFormatVersion).toBe(1);
			expect(second.ok && second.readFormatVersion).toBe(2);
			expect(first.ok && first.plan).toEqual(second.ok && second.plan);
		}
	});

	it('refuses format-2 parts in a format-1 file and names a format-1 key by its old name', () => {
		const v1 = JSON.parse(readFileSync('tests/unit/plans/format-1-reference.json', 'utf8'));
		expect(issuesOf({ ...v1, crops: [] })).toEqual([
			{ path: 'crops', message: 'Crops of your own need formatVersion 2.' }
		]);
		const practice = v1.practices.find((p: { crop: string }) => p.crop === 'corn');
		practice.residueGrazing = { leafHuskLbDmPerBu: -1 };
		expect(issuesOf(v1).map((i) => i.path)).toContain(
			`practices.${v1.practices.indexOf(practice)}.residueGrazing.leafHuskLbDmPerBu`
		);
	});
});
