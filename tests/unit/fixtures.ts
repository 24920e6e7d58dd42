import type { PlanDocumentInput } from '../../src/lib/schemas/plan-file';

/** A small, valid plan document (invented test data): two fields, a corn–soybean rotation, one herd. */
export function smallPlanInput(): PlanDocumentInput {
	return {
		formatVersion: 2,
		notes: 'Test farm, invented numbers.',
		farm: {
			name: 'Test Farm',
			region: 'Test Region',
			unitSystem: 'us',
			labourHoursAvailableByMonth: [100, 100, 150, 250, 300, 250, 200, 200, 250, 300, 200, 100],
			interestRatePercent: 8,
			fixedCostsUsdPerYear: 50000
		},
		fields: [
			{ id: 'east', name: 'East', acres: 80, productivityIndex: 1.05 },
			{ id: 'west', name: 'West', acres: 120, productivityIndex: 0.95 }
		],
		herd: {
			head: 40,
			averageWeightLb: 1250,
			feedingSeasonStartMonth: 11,
			feedingSeasonDays: 150,
			baleWeightLb: 1200,
			feedingWastePercent: 12,
			choreHoursPerDayFeedingHay: 1.5,
			choreHoursPerDayGrazing: 0.5
		},
		operations: [
			{
				id: 'plant',
				name: 'No-till planter',
				by: 'own',
				statedAs: 'machine',
				month: 5,
				speedMph: 5,
				widthFt: 30,
				fieldEfficiencyPercent: 65,
				fuel: { basis: 'per-acre', dieselGallonsPerAcre: 0.35 },
				repairsUsdPerAcre: 4
			},
			{
				id: 'spray',
				name: 'Sprayer',
				by: 'own',
				statedAs: 'machine',
				month: 6,
				speedMph: 8,
				widthFt: 90,
				fieldEfficiencyPercent: 65,
				fuel: { basis: 'pto-power', tractorMaxPtoHp: 120 },
				repairsUsdPerAcre: 1.5
			},
			{ id: 'harvest', name: 'Combine (custom)', by: 'custom', month: 10 }
		],
		practices: [
			{
				id: 'corn',
				name: 'Corn after soybean',
				crop: 'corn',
				yieldGoalPerAcre: 190,
				rowSpacingIn: 30,
				seed: { seedId: 'corn-seed', seedsPerAcre: 32000 },
				nitrogen: {
					appliedLbPerAcre: 'economic-optimum',
					response: { interceptBuPerAcre: 115, linearBuPerLbN: 0.85, quadraticBuPerLbN2: 0.0025 }
				},
				otherFertiliserUsdPerAcre: 40,
				chemicalsUsdPerAcre: 55,
				otherDirectUsdPerAcre: 30,
				operations: [
					{ operationId: 'plant' },
					{ operationId: 'spray', passes: 2 },
					{ operationId: 'harvest' }
				],
				residueGrazing: {}
			},
			{
				id: 'soy',
				name: 'Soybean after corn',
				crop: 'soybean',
				yieldGoalPerAcre: 58,
				rowSpacingIn: 15,
				seed: { seedId: 'soy-seed', seedsPerAcre: 140000 },
				otherFertiliserUsdPerAcre: 25,
				chemicalsUsdPerAcre: 45,
				operations: [
					{ operationId: 'plant' },
					{ operationId: 'spray' },
					{ operationId: 'harvest', month: 9 }
				],
				coverMix: {
					species: [{ seedId: 'rye', lbPerAcre: 50 }],
					biomassLbDmPerAcre: 800,
					legumeSharePercent: 0,
					grazingUtilisationPercent: 50
				}
			}
		],
		rotations: [{ id: 'corn-soy', name: 'Corn–soybean', practices: ['corn', 'soy'] }],
		priceSets: [2027, 2028].map((year) => ({
			year,
			cropPricesUsdPerUnit: { corn: 4.4, soybean: 10.6 },
			nitrogenUsdPerLb: 0.55,
			dieselUsdPerGallon: 3.6,
			labourUsdPerHour: 20,
			hayUsdPerBale: 60,
			seedPrices: {
				'corn-seed': { usdPerThousandSeeds: 3.6 },
				'soy-seed': { usdPerThousandSeeds: 0.45 },
				rye: { usdPerLb: 0.3 }
			},
			customRatesUsdPerAcre: { harvest: 38 }
		})),
		plan: {
			name: 'Test plan',
			horizon: { startYear: 2027, years: 2 },
			fieldRotations: [
				{ fieldId: 'east', rotationId: 'corn-soy', startingPhase: 1 },
				{ fieldId: 'west', rotationId: 'corn-soy', startingPhase: 2 }
			]
		}
	};
}

/** One 100-acre field of continuous corn, no herd, no operations, no interest or fixed costs: a clean
 * base for worked examples (invented numbers). */
export function oneCornFieldInput(): PlanDocumentInput {
	const input = smallPlanInput();
	input.fields = [{ id: 'home', name: 'Home', acres: 100 }];
	input.herd = null;
	input.farm.interestRatePercent = 0;
	input.farm.fixedCostsUsdPerYear = 0;
	input.operations = [];
	input.practices = [
		{
			id: 'corn',
			name: 'Corn',
			crop: 'corn',
			yieldGoalPerAcre: 180,
			otherFertiliserUsdPerAcre: 0,
			chemicalsUsdPerAcre: 0,
			operatingInterestMonths: 0
		}
	];
	input.rotations = [{ id: 'cc', name: 'Continuous corn', practices: ['corn'] }];
	input.plan.fieldRotations = [{ fieldId: 'home', rotationId: 'cc' }];
	for (const set of input.priceSets) {
		set.seedPrices = {};
		set.customRatesUsdPerAcre = {};
	}
	return input;
}
