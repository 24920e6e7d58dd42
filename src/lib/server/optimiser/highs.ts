// HiGHS off the request thread: one worker thread, loaded once, taking one job at a time. Imports are
// relative so the plan command line (run by tsx, without the app's aliases) uses this same module.
import { createRequire } from 'node:module';
import { Worker } from 'node:worker_threads';
import type { SolverAnswer } from '../../engine/optimiser/interpret';
import type { CsrModel } from '../../engine/optimiser/linear-model';
import { highsWorkerSource } from './highs-worker';

type Reply =
	| { id: number; kind: 'answer'; answer: SolverAnswer }
	| { id: number; kind: 'point'; index: number; answer: SolverAnswer }
	| { id: number; kind: 'done' }
	| { id: number; kind: 'failed'; message: string };

interface Pending {
	onReply: (reply: Reply) => void;
	fail: (error: Error) => void;
	watchdog: NodeJS.Timeout;
}

// Beyond HiGHS's own time limit, the worker gets this long to answer before it is taken as stuck.
const graceMs = 15_000;

let worker: Worker | null = null;
let nextId = 1;
const pending = new Map<number, Pending>();

function startWorker(): Worker {
	const highsPath = createRequire(import.meta.url).resolve('highs');
	const started = new Worker(highsWorkerSource, { eval: true, workerData: { highsPath } });
	started.on('message', (reply: Reply) => pending.get(reply.id)?.onReply(reply));
	const failAll = (error: Error) => {
		if (worker === started) worker = null;
		for (const [id, job] of pending) {
			clearTimeout(job.watchdog);
			pending.delete(id);
			job.fail(error);
		}
	};
	started.on('error', failAll);
	started.on('exit', (code) =>
		failAll(new Error(`The solver's worker stopped (exit code ${code}).`))
	);
	// An idle worker must not keep the command line (or a test run) alive.
	started.unref();
	return started;
}

function run(
	job: Record<string, unknown>,
	timeLimitSeconds: number,
	onReply: (reply: Reply, finish: () => void) => void
): Promise<void> {
	worker ??= startWorker();
	const current = worker;
	const id = nextId++;
	return new Promise((resolve, reject) => {
		const finish = () => {
			clearTimeout(pending.get(id)?.watchdog);
			pending.delete(id);
			if (pending.size === 0) current.unref();
			resolve();
		};
		const watchdog = setTimeout(
			() => {
				pending.delete(id);
				reject(new Error('The solver did not answer in time.'));
				void current.terminate();
			},
			timeLimitSeconds * 1000 + graceMs
		);
		pending.set(id, {
			onReply: (reply) => {
				if (reply.kind === 'failed') {
					clearTimeout(watchdog);
					pending.delete(id);
					if (pending.size === 0) current.unref();
					reject(new Error(reply.message));
				} else onReply(reply, finish);
			},
			fail: reject,
			watchdog
		});
		current.ref();
		current.postMessage({ ...job, id });
	});
}

/** How long HiGHS may take, and (whole fields) how close to the best bound it must come. */
export interface SolveLimits {
	timeLimitSeconds: number;
	gapPercent: number;
}

/** Solves the model with HiGHS within the limits. */
export async function solveWithHighs(model: CsrModel, limits: SolveLimits): Promise<SolverAnswer> {
	let answer: SolverAnswer | null = null;
	await run({ kind: 'solve', model, ...limits }, limits.timeLimitSeconds, (reply, finish) => {
		if (reply.kind === 'answer') {
			answer = reply.answer;
			finish();
		}
	});
	return answer!;
}

/**
 * Solves the model once for each point of `uppers`, with `rows`' upper bounds set to that point's
 * (one per row), on one persistent model; `onPoint` hears each answer as it comes.
 */
export function sweepWithHighs(
	model: CsrModel,
	rows: number[],
	uppers: number[][],
	limits: SolveLimits,
	onPoint: (index: number, answer: SolverAnswer) => void
): Promise<void> {
	return run(
		{ kind: 'sweep', model, rows, uppers, ...limits },
		limits.timeLimitSeconds * uppers.length,
		(reply, finish) => {
			if (reply.kind === 'point') onPoint(reply.index, reply.answer);
			if (reply.kind === 'done') finish();
		}
	);
}
