/**
 * The plan command line, printing JSON:
 * - `npm run plan -- evaluate <plan.json> [--against <reference.json>]`: the plan's results;
 * - `npm run plan -- optimise <plan.json> [--whole-fields] [--options <options.json>] [--lp-out <model.lp>]`:
 *   the best rotation mix (`--options` holds the optimiser's limits and weights; `--lp-out` also writes
 *   the model in CPLEX LP format).
 * A file that cannot be read, is not JSON or fails its schema is named on stderr with the path of each
 * bad value, and the command exits with code 2 (as do usage errors).
 *
 * `runPlanCommand` is the whole command, taking its arguments and output streams, so tests run it in
 * their own process; `scripts/plan.ts` only wires it to the real process. Never imported by browser code.
 */
import { readFile, writeFile } from 'node:fs/promises';
import type { Writable } from 'node:stream';
import { evaluatePlan, NonFiniteResultError, referenceHorizonIssues } from '../../src/lib/engine';
import { toFieldIssues, type FieldIssue } from '../../src/lib/schemas/issues';
import { optimiseOptionsSchema, type OptimiseOptions } from '../../src/lib/schemas/optimise';
import { parsePlanDocument, type PlanDocument } from '../../src/lib/schemas/plan-file';
import { optimisePlan, optimiserLpFile } from '../../src/lib/server/optimiser/optimise';

export interface PlanCommandStreams {
	stdout: Writable;
	stderr: Writable;
}

const usage = [
	'Usage: npm run plan -- evaluate <plan.json> [--against <reference.json>]',
	'       npm run plan -- optimise <plan.json> [--whole-fields] [--options <options.json>] [--lp-out <model.lp>]'
].join('\n');

class InputError extends Error {}

function fail(lines: string[]): never {
	throw new InputError(lines.join('\n'));
}

async function loadJson(file: string): Promise<unknown> {
	let text: string;
	try {
		text = await readFile(file, 'utf8');
	} catch (error) {
		fail([`${file}: cannot be read (${(error as NodeJS.ErrnoException).code ?? String(error)})`]);
	}
	try {
		return JSON.parse(text);
	} catch (error) {
		fail([`${file}: not valid JSON (${(error as Error).message})`]);
	}
}

async function loadPlan(file: string): Promise<PlanDocument> {
	const parsed = parsePlanDocument(await loadJson(file));
	if (!parsed.ok) fail(describeIssues(file, parsed.issues));
	return parsed.plan;
}

function describeIssues(file: string, issues: FieldIssue[], kind = 'plan file'): string[] {
	return [
		`${file}: not a valid ${kind} (${issues.length} problem${issues.length === 1 ? '' : 's'})`,
		...issues.map((issue) => `  ${issue.path}: ${issue.message}`)
	];
}

/** The results, or the input error naming each result that would not be a finite number. */
function evaluateOrRefuse(file: string, plan: PlanDocument, reference?: PlanDocument) {
	try {
		return evaluatePlan(plan, reference);
	} catch (error) {
		if (error instanceof NonFiniteResultError) fail(describeIssues(file, error.issues));
		throw error;
	}
}

type Command =
	| { command: 'evaluate'; planFile: string; referenceFile?: string }
	| {
			command: 'optimise';
			planFile: string;
			wholeFields: boolean;
			optionsFile?: string;
			lpOut?: string;
	  };

function parseArguments(args: string[]): Command {
	const [command, planFile, ...rest] = args;
	if (!planFile || planFile.startsWith('--')) fail([usage]);
	if (command === 'evaluate') {
		if (rest.length === 0) return { command, planFile };
		if (rest.length === 2 && rest[0] === '--against') {
			return { command, planFile, referenceFile: rest[1] };
		}
	}
	if (command === 'optimise') {
		const parsed: Command = { command, planFile, wholeFields: false };
		for (let i = 0; i < rest.length; i++) {
			const value = rest[i + 1];
			if (rest[i] === '--whole-fields') parsed.wholeFields = true;
			else if (rest[i] === '--options' && value) parsed.optionsFile = rest[++i];
			else if (rest[i] === '--lp-out' && value) parsed.lpOut = rest[++i];
			else fail([usage]);
		}
		return parsed;
	}
	fail([usage]);
}

async function loadOptions(
	file: string | undefined,
	wholeFields: boolean
): Promise<OptimiseOptions> {
	const input = file ? await loadJson(file) : {};
	const parsed = optimiseOptionsSchema.safeParse(input);
	if (!parsed.success) {
		fail(describeIssues(file!, toFieldIssues(parsed.error), 'optimiser options file'));
	}
	return wholeFields ? { ...parsed.data, wholeFields } : parsed.data;
}

async function evaluateCommand(planFile: string, referenceFile?: string) {
	const plan = await loadPlan(planFile);
	const reference = referenceFile ? await loadPlan(referenceFile) : undefined;
	if (reference) {
		const mismatch = referenceHorizonIssues(plan, reference);
		if (mismatch.length) fail(describeIssues(planFile, mismatch));
	}
	return evaluateOrRefuse(planFile, plan, reference);
}

async function optimiseCommand(command: Extract<Command, { command: 'optimise' }>) {
	const plan = await loadPlan(command.planFile);
	const options = await loadOptions(command.optionsFile, command.wholeFields);
	if (command.lpOut) {
		const lp = optimiserLpFile(plan, options);
		if (!lp.ok)
			fail(
				describeIssues(command.optionsFile ?? command.planFile, lp.issues, 'optimiser options file')
			);
		await writeFile(command.lpOut, lp.text);
	}
	const optimised = await optimisePlan(plan, options);
	if (!optimised.ok) {
		fail(
			describeIssues(
				command.optionsFile ?? command.planFile,
				optimised.issues,
				'optimiser options file'
			)
		);
	}
	return optimised.result;
}

/**
 * Writes `text` and waits until the stream has taken it. A reader that stops early (`| head`) closes
 * the pipe: that is the reader's choice, not a failure, so EPIPE ends the output quietly.
 */
function print(stream: Writable, text: string): Promise<void> {
	return new Promise((resolve, reject) => {
		const onError = (error: NodeJS.ErrnoException) => {
			if (error.code === 'EPIPE') resolve();
			else reject(error);
		};
		// A failed write emits 'error' after its callback, so the listener stays for that case.
		stream.on('error', onError);
		stream.write(text, (error) => {
			if (error) return;
			stream.off('error', onError);
			resolve();
		});
	});
}

/** Runs the command; resolves to the exit code. Errors that are not the user's input are thrown. */
export async function runPlanCommand(args: string[], streams: PlanCommandStreams): Promise<number> {
	let output: string;
	try {
		const command = parseArguments(args);
		const result =
			command.command === 'evaluate'
				? await evaluateCommand(command.planFile, command.referenceFile)
				: await optimiseCommand(command);
		output = JSON.stringify(result, null, 2) + '\n';
	} catch (error) {
		if (!(error instanceof InputError)) throw error;
		await print(streams.stderr, error.message + '\n');
		return 2;
	}
	await print(streams.stdout, output);
	return 0;
}
