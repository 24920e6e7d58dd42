/**
 * The plan command line: `npm run plan -- evaluate <plan.json> [--against <reference.json>]` prints the
 * results as JSON. A file that cannot be read, is not JSON or fails the plan schema is named on stderr
 * with the path of each bad value, and the command exits with code 2 (as do usage errors).
 */
import { readFileSync } from 'node:fs';
import { evaluatePlan, referenceHorizonIssues } from '../src/lib/engine';
import type { FieldIssue } from '../src/lib/schemas/issues';
import { parsePlanDocument, type PlanDocument } from '../src/lib/schemas/plan-file';

const usage = 'Usage: npm run plan -- evaluate <plan.json> [--against <reference.json>]';

class InputError extends Error {}

function fail(lines: string[]): never {
	throw new InputError(lines.join('\n'));
}

function loadPlan(file: string): PlanDocument {
	let text: string;
	try {
		text = readFileSync(file, 'utf8');
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

function parseArguments(args: string[]): { planFile: string; referenceFile?: string } {
	const [command, planFile, ...rest] = args;
	if (command !== 'evaluate' || !planFile || planFile.startsWith('--')) fail([usage]);
	if (rest.length === 0) return { planFile };
	if (rest.length === 2 && rest[0] === '--against') return { planFile, referenceFile: rest[1] };
	fail([usage]);
}

function main(args: string[]) {
	const { planFile, referenceFile } = parseArguments(args);
	const plan = loadPlan(planFile);
	const reference = referenceFile ? loadPlan(referenceFile) : undefined;
	if (reference) {
		const mismatch = referenceHorizonIssues(plan, reference);
		if (mismatch.length) fail(describeIssues(planFile, mismatch));
	}
	process.stdout.write(JSON.stringify(evaluatePlan(plan, reference), null, 2) + '\n');
}

try {
	main(process.argv.slice(2));
} catch (error) {
	if (!(error instanceof InputError)) throw error;
	process.stderr.write(error.message + '\n');
	process.exitCode = 2;
}
