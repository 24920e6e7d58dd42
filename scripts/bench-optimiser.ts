/**
 * The optimiser, for `npm run bench`, on generated farms (tests/support/generated-farm.ts): the time to
 * build the whole-farm model, then HiGHS through `solveWithHighs` (the worker round trip included, the
 * worker loaded and warmed first), each beside GLPK's `glpsol --lp` on the same model written as an LP
 * file, with both objectives. Targets: 100 fields × 8 rotations continuous under 50 ms a solve; a
 * 20-point trade-off of purchased N on that farm under 0.5 s; whole
 * fields on it to a 1 % gap under 1 s; 2000 × 10 continuous under 3 s. The machine is shared, so each
 * time is a median of several runs, with the CPU time the process spent beside it.
 */
import { execFile } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { performance } from 'node:perf_hooks';
import { promisify } from 'node:util';
import { buildFarmModel, type FarmModel } from '../src/lib/engine/optimiser/farm-model';
import { toCsr, type LinearModel } from '../src/lib/engine/optimiser/linear-model';
import { writeLpFile } from '../src/lib/engine/optimiser/lp-format';
import { optimiseOptionsSchema, type OptimiseOptions } from '../src/lib/schemas/optimise';
import type { PlanDocument } from '../src/lib/schemas/plan-file';
import { solveWithHighs } from '../src/lib/server/optimiser/highs';
import { tradeOffCurve } from '../src/lib/server/optimiser/optimise';
import { generatedFarm } from '../tests/support/generated-farm';

const run = promisify(execFile);

export const optimiserTargetsMs = {
	solve100: 50,
	tradeOff100: 500,
	wholeFields100: 1000,
	solve2000: 3000
};
const tradeOffPoints = 20;

export interface Timing {
	what: string;
	/** Median wall time, ms. */
	ms: number;
	/** Median CPU time of the whole process (the solver's worker included), ms. */
	cpuMs: number;
	runs: number;
	target: number | null;
}

export interface ObjectivePair {
	what: string;
	highs: number | null;
	glpsol: number | null;
}

export interface OptimiserBench {
	sizes: { what: string; columns: number; rows: number; nonZeros: number; peakRssMb: number }[];
	timings: Timing[];
	objectives: ObjectivePair[];
	notes: string[];
}

function median(values: number[]): number {
	const sorted = [...values].sort((a, b) => a - b);
	const middle = Math.floor(sorted.length / 2);
	return sorted.length % 2 ? sorted[middle] : (sorted[middle - 1] + sorted[middle]) / 2;
}

// RSS sampled while the main thread waits on the solver (a synchronous build is sampled after).
let peakRssBytes = 0;
const sampleRss = () => (peakRssBytes = Math.max(peakRssBytes, process.memoryUsage().rss));

async function timed<T>(
	what: string,
	runs: number,
	target: number | null,
	work: () => T | Promise<T>
): Promise<{ timing: Timing; last: T }> {
	const wall: number[] = [];
	const cpu: number[] = [];
	let last!: T;
	for (let i = 0; i < runs; i++) {
		const startCpu = process.cpuUsage();
		const start = performance.now();
		last = await work();
		wall.push(performance.now() - start);
		const used = process.cpuUsage(startCpu);
		cpu.push((used.user + used.system) / 1000);
		sampleRss();
	}
	// Progress on stderr: a slow step shows which it is.
	process.stderr.write(`  optimiser bench: ${what.trim()}, ${median(wall).toFixed(0)} ms\n`);
	return { timing: { what, ms: median(wall), cpuMs: median(cpu), runs, target }, last };
}

function options(input: Record<string, unknown> = {}): OptimiseOptions {
	return optimiseOptionsSchema.parse({ timeLimitSeconds: 60, ...input });
}

function build(plan: PlanDocument, opts: OptimiseOptions): FarmModel {
	const built = buildFarmModel(plan, opts);
	if (!built.ok) throw new Error(`The bench farm does not fit: ${JSON.stringify(built.issues)}`);
	return built.farm;
}

/** glpsol on the model's LP file; its objective (the constant term is a column fixed at 1). */
async function glpsol(dir: string, model: LinearModel, gapPercent: number | null) {
	const lp = join(dir, 'model.lp');
	const out = join(dir, 'out.txt');
	writeFileSync(lp, writeLpFile(model));
	const args = ['--lp', lp, '-o', out, '--tmlim', '120'];
	if (gapPercent !== null) args.push('--mipgap', String(gapPercent / 100));
	await run('glpsol', args, { maxBuffer: 64 * 1024 * 1024 });
	const match = /Objective:\s+\S+\s+=\s+(\S+)/.exec(readFileSync(out, 'utf8'));
	return match ? Number(match[1]) : null;
}

function size(what: string, model: LinearModel) {
	return {
		what,
		columns: model.columns.length,
		rows: model.rows.length,
		nonZeros: model.rows.reduce((sum, row) => sum + row.columns.length, 0),
		peakRssMb: 0
	};
}

export async function optimiserTimings(): Promise<OptimiserBench> {
	const dir = mkdtempSync(join(tmpdir(), 'furrowcast-bench-'));
	const sampler = setInterval(sampleRss, 10);
	const timings: Timing[] = [];
	const objectives: ObjectivePair[] = [];
	const notes: string[] = [];
	try {
		// 100 fields × 8 rotations.
		const small = generatedFarm(100, 8);
		const continuous = options();
		const farm = build(small, continuous);
		const sizes = [size('100 × 8', farm.model)];
		// Loads HiGHS in its worker and lets the WebAssembly tier up, as a running server has.
		for (let i = 0; i < 3; i++) await solveWithHighs(toCsr(farm.model), continuous);
		for (let i = 0; i < 3; i++) build(small, continuous);
		timings.push(
			(await timed('100×8 build model', 7, null, () => build(small, continuous))).timing
		);
		const models = Array.from({ length: 9 }, () => toCsr(build(small, continuous).model));
		let next = 0;
		const solved = await timed(
			'100×8 HiGHS solve',
			models.length,
			optimiserTargetsMs.solve100,
			() => solveWithHighs(models[next++], continuous)
		);
		timings.push(solved.timing);
		const glpk = await timed('  glpsol --lp', 3, null, () => glpsol(dir, farm.model, null));
		timings.push(glpk.timing);
		objectives.push({
			what: '100×8 continuous',
			highs: solved.last.objective,
			glpsol: glpk.last
		});

		// The trade-off: purchased N from half to all of what the unconstrained answer buys in its
		// heaviest year. (The generated farm's hired hands cost less than the labour rate, so the
		// unconstrained answer leaves the family no hours to sweep.)
		const nitrogenLb = Math.max(...solvedYears(solved.last.columnValues!, farm));
		const request = {
			options: continuous,
			sweep: {
				limit: 'nitrogen' as const,
				months: null,
				from: Math.floor(nitrogenLb / 2),
				to: Math.ceil(nitrogenLb),
				points: tradeOffPoints
			}
		};
		const curve = () => {
			const made = tradeOffCurve(small, request);
			if (!made.ok) throw new Error(JSON.stringify(made.issues));
			return made.run;
		};
		await curve()(() => {});
		const runs = Array.from({ length: 5 }, curve);
		let runIndex = 0;
		let optimalPoints = 0;
		const swept = await timed(
			`100×8 trade-off, ${tradeOffPoints} pts`,
			runs.length,
			optimiserTargetsMs.tradeOff100,
			async () => {
				optimalPoints = 0;
				await runs[runIndex++]((line) => {
					if (line.type === 'point' && line.point.result.status === 'optimal') optimalPoints++;
				});
			}
		);
		timings.push(swept.timing);
		notes.push(
			`trade-off: purchased N from ${request.sweep.from} to ${request.sweep.to} lb a year ` +
				`(build not included); ${optimalPoints} of ${tradeOffPoints} points optimal`
		);
		timings.push(
			(
				await timed('  with its model build', 3, null, async () => {
					await curve()(() => {});
				})
			).timing
		);

		// Whole fields to a 1 % gap.
		const whole = options({ wholeFields: true, gapPercent: 1 });
		const wholeFarm = build(small, whole);
		const wholeModels = Array.from({ length: 3 }, () => toCsr(build(small, whole).model));
		let wholeNext = 0;
		const wholeSolved = await timed(
			'100×8 whole fields, 1 % gap',
			wholeModels.length,
			optimiserTargetsMs.wholeFields100,
			() => solveWithHighs(wholeModels[wholeNext++], whole)
		);
		timings.push(wholeSolved.timing);
		const wholeGlpk = await timed('  glpsol --lp --mipgap 0.01', 1, null, () =>
			glpsol(dir, wholeFarm.model, 1)
		);
		timings.push(wholeGlpk.timing);
		objectives.push({
			what: '100×8 whole fields, 1 % gap',
			highs: wholeSolved.last.objective,
			glpsol: wholeGlpk.last
		});
		notes.push(
			`whole fields: HiGHS status ${wholeSolved.last.status}, gap ${wholeSolved.last.gapPercent?.toFixed(3)} %, ` +
				`best bound ${wholeSolved.last.bestBound?.toFixed(2)}`
		);
		sizes[0].peakRssMb = peakRssBytes / 1024 / 1024;

		// 2000 fields × 10 rotations.
		const large = generatedFarm(2000, 10);
		const builtLarge = await timed('2000×10 build model', 2, null, () => build(large, continuous));
		timings.push(builtLarge.timing);
		const largeModel = builtLarge.last.model;
		sizes.push(size('2000 × 10', largeModel));
		const largeSolved = await timed('2000×10 HiGHS solve', 3, optimiserTargetsMs.solve2000, () =>
			solveWithHighs(toCsr(largeModel), continuous)
		);
		timings.push(largeSolved.timing);
		const largeGlpk = await timed('  glpsol --lp', 1, null, () => glpsol(dir, largeModel, null));
		timings.push(largeGlpk.timing);
		objectives.push({
			what: '2000×10 continuous',
			highs: largeSolved.last.objective,
			glpsol: largeGlpk.last
		});
		sizes[1].peakRssMb = peakRssBytes / 1024 / 1024;
		notes.push(
			"glpsol: wall time includes writing and reading the LP file; its cpu ms is this process's (writing the file), not glpsol's"
		);
		return { sizes, timings, objectives, notes };
	} finally {
		clearInterval(sampler);
		rmSync(dir, { recursive: true, force: true });
	}
}

/** Purchased N in each year of an answer, lb. */
function solvedYears(columnValues: Float64Array, farm: FarmModel): number[] {
	return farm.years.map((_, y) =>
		farm.choices.reduce(
			(sum, c) => sum + columnValues[c.column] * c.years[y].nitrogenPurchasedLb,
			0
		)
	);
}
