import { execFile } from 'node:child_process';
import { mkdtempSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { promisify } from 'node:util';
import { describe, expect, it } from 'vitest';
import { farmYearNames, partialBudgetNames } from '../support/result-contract';

const run = promisify(execFile);

interface Outcome {
	code: number;
	stdout: string;
	stderr: string;
}

async function plan(...args: string[]): Promise<Outcome> {
	try {
		const { stdout, stderr } = await run('npx', ['tsx', 'scripts/plan.ts', ...args], {
			maxBuffer: 64 * 1024 * 1024
		});
		return { code: 0, stdout, stderr };
	} catch (error) {
		const e = error as { code: number; stdout: string; stderr: string };
		return { code: e.code, stdout: e.stdout, stderr: e.stderr };
	}
}

const scenarioFiles = readdirSync('scenarios')
	.filter((f) => f.endsWith('.json'))
	.map((f) => join('scenarios', f));

// The contract names, and the lines and per-acre figures behind each part of the budget.
const budgetNames = [...partialBudgetNames, 'lines', 'perAcre'];

function writeTemp(name: string, text: string): string {
	const file = join(mkdtempSync(join(tmpdir(), 'plan-cli-')), name);
	writeFileSync(file, text);
	return file;
}

describe('plan evaluate', () => {
	it('evaluates every scenario against the reference plan', { timeout: 60_000 }, async () => {
		expect(scenarioFiles.length).toBeGreaterThanOrEqual(4);
		const outcomes = await Promise.all(
			scenarioFiles.map((file) => plan('evaluate', file, '--against', 'scenarios/reference.json'))
		);
		for (const [i, outcome] of outcomes.entries()) {
			expect(outcome.code, `${scenarioFiles[i]}: ${outcome.stderr}`).toBe(0);
			const result = JSON.parse(outcome.stdout);
			expect(result.formatVersion).toBe(1);
			expect(result.plan.name).toEqual(expect.any(String));
			expect(result.farmYears).toHaveLength(5);
			for (const farmYear of result.farmYears) {
				expect(Object.keys(farmYear)).toEqual(expect.arrayContaining(farmYearNames));
				expect(farmYear.labourHoursByMonth).toHaveLength(12);
			}
			expect(result.fieldYears).toHaveLength(14 * 5);
			expect(Object.keys(result.fieldYears[0])).toEqual(
				expect.arrayContaining([
					'fieldId',
					'year',
					'crop',
					'acres',
					'nitrogen',
					'forage',
					'operations'
				])
			);
			expect(result.partialBudget.years).toHaveLength(5);
			for (const part of [...result.partialBudget.years, result.partialBudget.average]) {
				expect(Object.keys(part)).toEqual(expect.arrayContaining(budgetNames));
				expect(Object.keys(part.lines)).toEqual([
					'addedReturns',
					'reducedCosts',
					'addedCosts',
					'reducedReturns'
				]);
			}
		}
	});

	it('prints no partial budget without --against', { timeout: 30_000 }, async () => {
		const outcome = await plan('evaluate', 'scenarios/reference.json');
		expect(outcome.code).toBe(0);
		expect(JSON.parse(outcome.stdout).partialBudget).toBeUndefined();
	});

	it(
		'refuses malformed files with exit code 2, naming the bad paths',
		{ timeout: 60_000 },
		async () => {
			const reference = JSON.parse(readFileSync('scenarios/reference.json', 'utf8'));
			const badValues = structuredClone(reference);
			badValues.fields[3].acres = -40;
			badValues.plan.fieldRotations[2].rotationId = 'corn-corn';
			badValues.herd.feedingSeasonStartMonth = 13;
			const shortHorizon = structuredClone(reference);
			shortHorizon.plan.horizon.years = 3;

			const [missing, notJson, invalid, usage, badOption, horizon] = await Promise.all([
				plan('evaluate', 'scenarios/no-such-plan.json'),
				plan('evaluate', writeTemp('truncated.json', '{"formatVersion": 1, "farm": ')),
				plan('evaluate', writeTemp('bad-values.json', JSON.stringify(badValues))),
				plan('evaluate'),
				plan('evaluate', 'scenarios/reference.json', '--versus', 'scenarios/reference.json'),
				plan(
					'evaluate',
					'scenarios/reference.json',
					'--against',
					writeTemp('short.json', JSON.stringify(shortHorizon))
				)
			]);
			expect(missing.code).toBe(2);
			expect(missing.stderr).toMatch(/no-such-plan\.json: cannot be read/);
			expect(notJson.code).toBe(2);
			expect(notJson.stderr).toMatch(/truncated\.json: not valid JSON/);
			expect(invalid.code).toBe(2);
			expect(invalid.stdout).toBe('');
			expect(invalid.stderr).toContain('fields.3.acres: Must be more than 0');
			expect(invalid.stderr).toContain(
				'plan.fieldRotations.2.rotationId: Unknown rotation "corn-corn"'
			);
			expect(invalid.stderr).toContain('herd.feedingSeasonStartMonth:');
			expect(usage.code).toBe(2);
			expect(usage.stderr).toMatch(/^Usage: /);
			expect(badOption.code).toBe(2);
			expect(horizon.code).toBe(2);
			expect(horizon.stderr).toContain('does not cover 2030');
		}
	);
});
