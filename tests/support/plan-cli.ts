import { Writable } from 'node:stream';
import { runPlanCommand } from '../../scripts/lib/plan-cli';

export interface PlanOutcome {
	code: number;
	stdout: string;
	stderr: string;
}

/** A stream that keeps what is written to it. */
function collector() {
	const chunks: Buffer[] = [];
	const stream = new Writable({
		write(chunk: Buffer, _encoding, done) {
			chunks.push(chunk);
			done();
		}
	});
	return { stream, text: () => Buffer.concat(chunks).toString('utf8') };
}

/** `npm run plan -- <args>` run in this process: its exit code and what it printed. */
export async function runPlan(...args: string[]): Promise<PlanOutcome> {
	const stdout = collector();
	const stderr = collector();
	const code = await runPlanCommand(args, { stdout: stdout.stream, stderr: stderr.stream });
	return { code, stdout: stdout.text(), stderr: stderr.text() };
}
