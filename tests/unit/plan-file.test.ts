import { describe, expect, it } from 'vitest';
import { parsePlanDocument } from '../../src/lib/schemas/plan-file';
import { smallPlanInput } from './fixtures';

function issuesOf(input: unknown) {
	const result = parsePlanDocument(input);
	if (result.ok) throw new Error('expected the document to be refused');
	return result.issues;
}

describe('parsePlanDocument', () => {
	it('accepts a valid document and fills in defaults visibly', () => {
		const result = parsePlanDocument(smallPlanInput());
		expect(result.ok).toBe(true);
		if (!result.ok) return;
		const { plan } = result;
		// farmdoc machinery cost tables: labour hours = 1.1 × machine hours
		expect(plan.operations[0]).toMatchObject({ by: 'own', labourFactor: 1.1 });
		// ISU A3-29: 0.044 gal diesel per hour per max PTO hp
		expect(plan.operations[1]).toMatchObject({ fuel: { dieselGallonsPerHpHour: 0.044 } });
		// SRM glossary: 26 lb DM per AU-day; UNL/UF: hay at 88 % DM
		expect(plan.herd).toMatchObject({ intakeLbDmPerAuDay: 26, baleDryMatterPercent: 88 });
		// UNL Rasby 2007: 16 lb leaf+husk per bu of corn (the crop's own figure), 50 % utilisation
		expect(plan.practices[0].residueGrazing).toEqual({
			leafHuskLbDmPerUnit: 16,
			utilisationPercent: 50
		});
		// SARE MCCP: 3.5 % N in annual legumes, half available the first season
		expect(plan.practices[1].coverMix).toMatchObject({
			legumeNitrogenPercent: 3.5,
			nitrogenAvailablePercent: 50
		});
		expect(plan.practices[1].nitrogen).toEqual({ appliedLbPerAcre: 0, response: null });
	});

	it('refuses a wrong format version and unknown keys, naming the path', () => {
		const input = { ...smallPlanInput(), formatVersion: 3, extra: true };
		const issues = issuesOf(input);
		expect(issues).toContainEqual({
			path: 'formatVersion',
			message: 'formatVersion is 2 (files of the first format, 1, are read too).'
		});
		expect(issues).toContainEqual({
			path: '(document)',
			message: 'Unknown key "extra": check the spelling against the plan format.'
		});
	});

	it('names the path of a bad value', () => {
		const input = smallPlanInput();
		input.fields[1].acres = -5;
		input.farm.labourHoursAvailableByMonth = [1, 2, 3];
		const issues = issuesOf(input);
		expect(issues.map((i) => i.path)).toEqual(
			expect.arrayContaining(['fields.1.acres', 'farm.labourHoursAvailableByMonth'])
		);
	});

	it('refuses a field naming an unknown rotation', () => {
		const input = smallPlanInput();
		input.plan.fieldRotations[0].rotationId = 'corn-corn';
		expect(issuesOf(input)).toContainEqual({
			path: 'plan.fieldRotations.0.rotationId',
			message: 'Unknown rotation "corn-corn"'
		});
	});

	it('refuses a rotation naming an unknown practice', () => {
		const input = smallPlanInput();
		input.rotations[0].practices = ['corn', 'oats'];
		expect(issuesOf(input)).toContainEqual({
			path: 'rotations.0.practices.1',
			message: 'Unknown practice "oats"'
		});
	});

	it('refuses a starting phase out of range', () => {
		const input = smallPlanInput();
		input.plan.fieldRotations[1].startingPhase = 3;
		const issue = issuesOf(input).find((i) => i.path === 'plan.fieldRotations.1.startingPhase');
		expect(issue?.message).toMatch(/out of range/);
	});

	it('refuses a plan year with no price set', () => {
		const input = smallPlanInput();
		input.plan.horizon.years = 3;
		expect(issuesOf(input)).toContainEqual({
			path: 'priceSets',
			message: 'No price set for plan year 2029'
		});
	});

	it('refuses missing prices, unknown operations, unassigned fields and duplicates', () => {
		const input = smallPlanInput();
		input.priceSets[0].cropPricesUsdPerUnit = { corn: 4 };
		input.priceSets[1].customRatesUsdPerAcre = {};
		input.practices[0].operations = [{ operationId: 'chisel' }];
		input.plan.fieldRotations = [input.plan.fieldRotations[0]];
		input.fields.push({ id: 'east', name: 'East again', acres: 10 });
		const paths = issuesOf(input).map((i) => i.path);
		expect(paths).toEqual(
			expect.arrayContaining([
				'priceSets.0.cropPricesUsdPerUnit.soybean',
				'priceSets.1.customRatesUsdPerAcre.harvest',
				'practices.0.operations.0.operationId',
				'fields.1.id',
				'fields.2.id'
			])
		);
	});
});

describe('prices the N response needs', () => {
	it('refuses a zero grain price for a crop with an N response curve, naming the price', () => {
		// The fixture's corn practice carries an N response curve.
		const input = smallPlanInput();
		input.priceSets[0].cropPricesUsdPerUnit.corn = 0;
		expect(issuesOf(input).map((i) => i.path)).toContain('priceSets.0.cropPricesUsdPerUnit.corn');
	});
});
