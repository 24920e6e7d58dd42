// `npm run plan -- …`: the plan command line (scripts/lib/plan-cli.ts) on this process's streams.
import { runPlanCommand } from './lib/plan-cli';

process.exitCode = await runPlanCommand(process.argv.slice(2), {
	stdout: process.stdout,
	stderr: process.stderr
});
