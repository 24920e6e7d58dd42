// `npm run plan -- optimise`, run in this process (HiGHS in its worker thread): the JSON it prints,
// its refusals (exit code 2, naming the file and the bad value's path), and the LP file it writes,
// which GLPK 5.0 glpsol (Debian package glpk-utils) solves to the objective the command printed.
import { mkdtemp, readFile, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import type { OptimiseResult } from '../../src/lib/engine/optimiser/types';
import { runPlan as plan } from '../support/plan-cli';
import { glpsol, relativeDifference } from '../support/optimiser';

async function tempFile(name: string, text: string): Promise<string> {
	const file = join(await mkdtemp(join(tmpdir(), 'plan-optimise-')), name);
	await writeFile(file, text);
	return file;
}

const printed = (stdout: string) => JSON.parse(stdout) as OptimiseResult;

describe('plan optimise', () => {
	it('prints the best mix: status, objective, each field’s rotations with acres, binding limits', async () => {
		// Purchased N capped below what corn on most fields in the same year needs, so the cap binds.
		const options = await tempFile(
			'options.json',
			JSON.stringify({ limits: { nitrogenPurchasedLbPerYear: 45_000 } })
		);
		const outcome = await plan('optimise', 'scenarios/reference.json', '--options', options);
		expect(outcome.code, outcome.stderr).toBe(0);
		const result = printed(outcome.stdout);
		expect(result.status).toBe('optimal');
		expect(result.wholeFields).toBe(false);
		expect(typeof result.objectiveUsd).toBe('number');
		expect(result.fields).toHaveLength(14);
		const reference = JSON.parse(await readFile('scenarios/reference.json', 'utf8'));
		for (const field of result.fields) {
			const acres = reference.fields.find((f: { id: string }) => f.id === field.fieldId).acres;
			expect(field.acres).toBe(acres);
			expect(field.rotations.length).toBeGreaterThan(0);
			for (const r of field.rotations) {
				expect(r.rotationId).toBe('corn-soybean');
				expect(r.acres).toBeGreaterThan(0);
			}
			expect(Math.abs(field.rotations.reduce((s, r) => s + r.acres, 0) - acres)).toBeLessThan(1e-6);
		}
		expect(result.bindingLimits.length).toBeGreaterThan(0);
		for (const limit of result.bindingLimits) {
			expect(limit.name).toMatch(/^nitrogen_20\d\d$/);
			expect(limit.marginalValueUsd).toBeGreaterThan(0);
			expect(limit.limit).toBe(45_000);
		}
		expect(result.years).toHaveLength(5);
		for (const year of result.years) {
			expect(year.nitrogenPurchasedLb).toBeLessThanOrEqual(45_000 * (1 + 1e-9));
		}
	});

	it('takes fields whole with --whole-fields', async () => {
		const outcome = await plan('optimise', 'scenarios/wide-row-interseeded.json', '--whole-fields');
		expect(outcome.code, outcome.stderr).toBe(0);
		const result = printed(outcome.stdout);
		expect(result.wholeFields).toBe(true);
		expect(result.model.integerColumns).toBeGreaterThan(0);
		for (const field of result.fields) {
			expect(field.rotations).toHaveLength(1);
			expect(field.split).toBe(false);
		}
	});

	it('writes with --lp-out an LP file glpsol solves to the objective it printed', async () => {
		// Whole fields to a gap of 0, so the printed answer is the optimum glpsol proves.
		const exact = await tempFile('options.json', JSON.stringify({ gapPercent: 0 }));
		for (const flags of [[], ['--whole-fields', '--options', exact]]) {
			const lpOut = join(await mkdtemp(join(tmpdir(), 'plan-optimise-')), 'model.lp');
			const outcome = await plan(
				'optimise',
				'scenarios/small-grain-peas.json',
				...flags,
				'--lp-out',
				lpOut
			);
			expect(outcome.code, outcome.stderr).toBe(0);
			const result = printed(outcome.stdout);
			const glpk = await glpsol(await readFile(lpOut, 'utf8'));
			expect(glpk.status).toBe('optimal');
			expect(result.wholeFields).toBe(flags.length > 0);
			expect(relativeDifference(glpk.objective, result.objectiveUsd!)).toBeLessThan(1e-6);
		}
	});

	it('refuses a bad plan file with exit code 2, naming the file and the bad values', async () => {
		const reference = JSON.parse(await readFile('scenarios/reference.json', 'utf8'));
		reference.fields[2].acres = -5;
		const bad = await tempFile('bad-plan.json', JSON.stringify(reference));
		const outcome = await plan('optimise', bad);
		expect(outcome.code).toBe(2);
		expect(outcome.stdout).toBe('');
		expect(outcome.stderr).toContain(bad);
		expect(outcome.stderr).toContain('fields.2.acres');

		const missing = await plan('optimise', 'scenarios/no-such-plan.json');
		expect(missing.code).toBe(2);
		expect(missing.stderr).toContain('scenarios/no-such-plan.json');
	});

	it('refuses a bad options file with exit code 2, naming the file and the bad values', async () => {
		const cases: [string, string][] = [
			[
				JSON.stringify({ limits: { nitrogenPurchasedLbPerYear: -10 } }),
				'limits.nitrogenPurchasedLbPerYear'
			],
			[
				JSON.stringify({ limits: { familyLabourHoursByMonth: [200, 200] } }),
				'limits.familyLabourHoursByMonth'
			],
			[JSON.stringify({ weights: { nitrogenUsdPerLb: 'a lot' } }), 'weights.nitrogenUsdPerLb'],
			// Options that are well formed but do not fit the plan: no such field on the farm.
			[
				JSON.stringify({
					limits: { fixedFields: [{ fieldId: 'no-such-field', rotationId: 'corn-soybean' }] }
				}),
				'limits.fixedFields.0.fieldId'
			],
			['{ not json', 'not valid JSON']
		];
		for (const [text, named] of cases) {
			const options = await tempFile('options.json', text);
			const outcome = await plan('optimise', 'scenarios/reference.json', '--options', options);
			expect(outcome.code, text).toBe(2);
			expect(outcome.stdout).toBe('');
			expect(outcome.stderr).toContain(options);
			expect(outcome.stderr).toContain(named);
		}
	});

	it('prints an infeasible answer (exit code 0) with the conflicting limits', async () => {
		const options = await tempFile(
			'options.json',
			JSON.stringify({ limits: { nitrogenPurchasedLbPerYear: 0 } })
		);
		const outcome = await plan('optimise', 'scenarios/reference.json', '--options', options);
		expect(outcome.code, outcome.stderr).toBe(0);
		const result = printed(outcome.stdout);
		expect(result.status).toBe('infeasible');
		expect(result.conflicts.some((c) => c.name.startsWith('nitrogen_'))).toBe(true);
	});
});
