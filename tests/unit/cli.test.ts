import { execFile } from 'node:child_process';
import { mkdtemp, readdir, readFile, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { Writable } from 'node:stream';
import { describe, expect, it } from 'vitest';
import { runPlanCommand } from '../../scripts/lib/plan-cli';
import { runPlan as plan, type PlanOutcome } from '../support/plan-cli';
import { farmYearNames, partialBudgetNames } from '../support/result-contract';

const scenarioFiles = (await readdir('scenarios'))
	.filter((f) => f.endsWith('.json'))
	.map((f) => join('scenarios', f));

// The contract names, and the lines and per-acre figures behind each part of the budget.
const budgetNames = [...partialBudgetNames, 'lines', 'perAcre'];

async function writeTemp(name: string, text: string): Promise<string> {
	const file = join(await mkdtemp(join(tmpdir(), 'plan-cli-')), name);
	await writeFile(file, text);
	return file;
}

describe('plan evaluate', () => {
	it('evaluates every scenario against the reference plan', async () => {
		expect(scenarioFiles.length).toBeGreaterThanOrEqual(4);
		for (const file of scenarioFiles) {
			const outcome = await plan('evaluate', file, '--against', 'scenarios/reference.json');
			expect(outcome.code, `${file}: ${outcome.stderr}`).toBe(0);
			const result = JSON.parse(outcome.stdout);
			expect(result.formatVersion).toBe(2);
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

	it('prints no partial budget without --against', async () => {
		const outcome = await plan('evaluate', 'scenarios/reference.json');
		expect(outcome.code).toBe(0);
		expect(JSON.parse(outcome.stdout).partialBudget).toBeUndefined();
	});

	it('refuses malformed files with exit code 2, naming the bad paths', async () => {
		const reference = JSON.parse(await readFile('scenarios/reference.json', 'utf8'));
		const badValues = structuredClone(reference);
		badValues.fields[3].acres = -40;
		badValues.plan.fieldRotations[2].rotationId = 'corn-corn';
		badValues.herd.feedingSeasonStartMonth = 13;
		const shortHorizon = structuredClone(reference);
		shortHorizon.plan.horizon.years = 3;

		const missing = await plan('evaluate', 'scenarios/no-such-plan.json');
		const notJson = await plan(
			'evaluate',
			await writeTemp('truncated.json', '{"formatVersion": 1, "farm": ')
		);
		const invalid = await plan(
			'evaluate',
			await writeTemp('bad-values.json', JSON.stringify(badValues))
		);
		const usage = await plan('evaluate');
		const badOption = await plan(
			'evaluate',
			'scenarios/reference.json',
			'--versus',
			'scenarios/reference.json'
		);
		const horizon = await plan(
			'evaluate',
			'scenarios/reference.json',
			'--against',
			await writeTemp('short.json', JSON.stringify(shortHorizon))
		);
		expect(missing.code).toBe(2);
		expect(missing.stderr).toMatch(/no-such-plan\.json: cannot be read/);
		expect(notJson.code).toBe(2);
		expect(notJson.stderr).toMatch(/truncated\.json: not valid JSON/);
		expect(invalid.code).toBe(2);
		expect(invalid.stdout).toBe('');
		expect(invalid.stderr).toContain('fields.3.acres: Field area must be at least 0.01 acres.');
		expect(invalid.stderr).toContain(
			'plan.fieldRotations.2.rotationId: Unknown rotation "corn-corn"'
		);
		expect(invalid.stderr).toContain('herd.feedingSeasonStartMonth:');
		expect(usage.code).toBe(2);
		expect(usage.stderr).toMatch(/^Usage: /);
		expect(badOption.code).toBe(2);
		expect(horizon.code).toBe(2);
		expect(horizon.stderr).toContain('does not cover 2030');
	});

	it('stops quietly with code 0 when the reader closes the output early', async () => {
		let written = 0;
		const closedEarly = new Writable({
			write(chunk: Buffer, _encoding, done) {
				written += chunk.length;
				done(Object.assign(new Error('write EPIPE'), { code: 'EPIPE' }));
			}
		});
		const stderr = new Writable({ write: (_chunk, _encoding, done) => done() });
		await expect(
			runPlanCommand(['evaluate', 'scenarios/reference.json'], { stdout: closedEarly, stderr })
		).resolves.toBe(0);
		expect(written).toBeGreaterThan(0);
	});
});

/** Runs a real process without blocking this one; a failing exit is an outcome, not an error. */
function spawned(command: string, args: string[]): Promise<PlanOutcome> {
	return new Promise((resolve) => {
		execFile(command, args, { maxBuffer: 64 * 1024 * 1024 }, (error, stdout, stderr) => {
			resolve({ code: error ? Number(error.code) : 0, stdout, stderr });
		});
	});
}

// `npm run plan` is `tsx scripts/plan.ts`; node with tsx's loader runs the same code in one process,
// where the tsx command would start a second node.
const planCommand = [process.execPath, '--import', 'tsx', 'scripts/plan.ts'];

describe('the plan command as a process', () => {
	it(
		'exits 2 on bad input, and 0 without a word when piped into head',
		{ timeout: 60_000 },
		async () => {
			const [missing, piped] = await Promise.all([
				spawned(planCommand[0], [
					...planCommand.slice(1),
					'evaluate',
					'scenarios/no-such-plan.json'
				]),
				// pipefail: the pipeline's status is the plan command's, not head's. The output is far
				// larger than a pipe holds, so the command is still writing when head exits.
				spawned('bash', [
					'-o',
					'pipefail',
					'-c',
					`${planCommand.join(' ')} evaluate scenarios/reference.json | head -c 10`
				])
			]);
			expect(missing.code).toBe(2);
			expect(missing.stdout).toBe('');
			expect(missing.stderr).toMatch(/^scenarios\/no-such-plan\.json: cannot be read/);
			expect(piped).toEqual({ code: 0, stdout: '{\n  "forma', stderr: '' });
		}
	);
});
