/**
 * The plan command line: `npm run plan -- evaluate <plan.json> [--against <reference.json>]` prints the
 * results as JSON. A file that cannot be read, is not JSON or fails the plan schema is named on stderr
 * with the path of each bad value, and the command exits with code 2 (as do usage errors).
 *
 * `runPlanCommand` is the whole command, taking its arguments and output streams, so tests run it in
 * their own process; `scripts/plan.ts` only wires it to the real process. Never imported by browser code.
 */
import { readFile } from 'node:fs/promises';
import type { Writable } from 'node:stream';
import { evaluatePlan, NonFiniteResultError, referenceHorizonIssues } from '../../src/lib/engine';
import type { FieldIssue } from '../../src/lib/schemas/issues';
import { parsePlanDocument, type PlanDocument } from '../../src/lib/schemas/plan-file';

export interface PlanCommandStreams {
	stdout: Writable;
	stderr: Writable;
}

const usage = 'Usage: npm run plan -- evaluate <plan.json> [--against <reference.json>]';

class InputError extends Error {}

function fail(lines: string[]): never {
	throw new InputError(lines.join('\n'));
}

async function loadPlan(file: string): Promise<PlanDocument> {
	let text: string;
	try {
		text = await readFile(file, 'utf8');
	} catch (error) {
		fail([`${file}: cannot be read (${(error as NodeJS.ErrnoException).code ?? String(error)})`]);
	}
	let json: unknown;
	try {
		json = JSON.parse(text);
	} catch (error) {
		fail([`${file}: not valid JSON (${(error as Error).message})`]);
	}
	const parsed = parsePlanDocument(json);
	if (!parsed.ok) fail(describeIssues(file, parsed.issues));
	return parsed.plan;
}

function describeIssues(file: string, issues: FieldIssue[]): string[] {
	return [
		`${file}: not a valid plan file (${issues.length} problem${issues.length === 1 ? '' : 's'})`,
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

function parseArguments(args: string[]): { planFile: string; referenceFile?: string } {
	const [command, planFile, ...rest] = args;
	if (command !== 'evaluate' || !planFile || planFile.startsWith('--')) fail([usage]);
	if (rest.length === 0) return { planFile };
	if (rest.length === 2 && rest[0] === '--against') return { planFile, referenceFile: rest[1] };
	fail([usage]);
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
		const { planFile, referenceFile } = parseArguments(args);
		const plan = await loadPlan(planFile);
		const reference = referenceFile ? await loadPlan(referenceFile) : undefined;
		if (reference) {
			const mismatch = referenceHorizonIssues(plan, reference);
			if (mismatch.length) fail(describeIssues(planFile, mismatch));
		}
		output = JSON.stringify(evaluateOrRefuse(planFile, plan, reference), null, 2) + '\n';
	} catch (error) {
		if (!(error instanceof InputError)) throw error;
		await print(streams.stderr, error.message + '\n');
		return 2;
	}
	await print(streams.stdout, output);
	return 0;
}
