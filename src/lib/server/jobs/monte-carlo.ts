// The Monte Carlo as a queued job: the plan files are taken when the run is asked for (so a later
// edit does not change a run under way), the draws are made in steps with the event loop free between
// them, progress is saved as it goes, and the result is the job's output, written by the queue in the
// one statement that completes the job.
import { randomInt } from 'node:crypto';
import { NonFiniteResultError, referenceHorizonIssues } from '$lib/engine';
import {
	createMonteCarlo,
	defaultComovement,
	riskModel,
	type MonteCarloOptions,
	type MonteCarloResult
} from '$lib/engine/risk/monte-carlo';
import { maxSeed, type MonteCarloRequest } from '$lib/schemas/monte-carlo';
import type { PlanDocument } from '$lib/schemas/plan-file';
import { optionsRefused } from '$lib/server/api';
import { db } from '$lib/server/db';
import { recordJobStart, saveJobProgress } from '$lib/server/db/jobs';
import { findReferencePlan, type PlanRow } from '$lib/server/db/plans';
import { storedPlanDocument } from '$lib/server/plans';
import { workerName, type JobOwner } from './queue';

export interface PlanRef {
	planId: string;
	name: string;
	version: number;
}

export interface MonteCarloJobData extends JobOwner {
	plan: PlanRef;
	reference: PlanRef | null;
	options: MonteCarloOptions;
	planDocument: PlanDocument;
	referenceDocument: PlanDocument | null;
}

export interface MonteCarloJobResult extends MonteCarloResult {
	planVersion: number;
	referencePlan: PlanRef | null;
}

/** Thrown between steps when the server is stopping: the queue fails the job, and so retries it. */
export class WorkerStopping extends Error {
	constructor() {
		super('The app server stopped during the run; the job will run again on a server that is up.');
	}
}

const drawsPerStep = 500;
const progressEveryMs = 250;

const nextTurn = () => new Promise<void>((resolve) => setImmediate(resolve));

export async function runMonteCarloJob(
	jobId: string,
	data: MonteCarloJobData,
	isStopping: () => boolean
): Promise<MonteCarloJobResult> {
	await recordJobStart(db, jobId, data.options.draws, workerName);
	const plan = riskModel(data.planDocument);
	const reference = data.referenceDocument ? riskModel(data.referenceDocument) : null;
	const run = createMonteCarlo(plan, reference, data.options);
	let savedAt = Date.now();
	while (run.done < run.total) {
		if (isStopping()) throw new WorkerStopping();
		run.step(drawsPerStep);
		if (Date.now() - savedAt >= progressEveryMs) {
			await saveJobProgress(db, jobId, run.done);
			savedAt = Date.now();
		}
		await nextTurn();
	}
	if (isStopping()) throw new WorkerStopping();
	await saveJobProgress(db, jobId, run.done);
	return { ...run.result(), planVersion: data.plan.version, referencePlan: data.reference };
}

type Farm = Parameters<typeof storedPlanDocument>[1];
type Asked = { ok: true; data: MonteCarloJobData } | { ok: false; response: Response };

/**
 * A Monte Carlo run asked for on a plan: the plan's newest version and the farm's reference plan as
 * plan files, the options with their defaults filled in (a seed chosen when none was given). Crops the
 * plans do not grow, or a plan that does not evaluate: 422 naming why. The reference plan is left out
 * when it is this plan, does not evaluate, or covers other years.
 */
export async function monteCarloJobData(
	farm: Farm,
	plan: PlanRow,
	userId: string,
	request: MonteCarloRequest
): Promise<Asked> {
	const referenceRow = await findReferencePlan(db, farm.id);
	const [stored, storedReference] = await Promise.all([
		storedPlanDocument(db, farm, plan),
		referenceRow && referenceRow.id !== plan.id
			? storedPlanDocument(db, farm, referenceRow)
			: undefined
	]);
	if (!stored.ok) return stored;
	const referenceDocument =
		storedReference?.ok &&
		referenceHorizonIssues(stored.document, storedReference.document).length === 0
			? storedReference.document
			: null;
	let crops: string[];
	try {
		crops = [
			...new Set([
				...riskModel(stored.document).crops,
				...(referenceDocument ? riskModel(referenceDocument).crops : [])
			])
		];
	} catch (error) {
		if (!(error instanceof NonFiniteResultError)) throw error;
		return { ok: false, response: optionsRefused(error.issues) };
	}
	const grown = new Set(crops);
	const issues = request.crops.flatMap((c, i) =>
		grown.has(c.crop)
			? []
			: [
					{
						path: `crops.${i}.crop`,
						message: `Neither this plan nor the reference plan grows "${c.crop}": grown are ${crops.join(', ')}.`
					}
				]
	);
	if (issues.length) return { ok: false, response: optionsRefused(issues) };
	return {
		ok: true,
		data: {
			farmId: farm.id,
			planId: plan.id,
			userId,
			plan: { planId: plan.id, name: plan.name, version: plan.currentVersion },
			reference:
				referenceDocument && referenceRow
					? {
							planId: referenceRow.id,
							name: referenceRow.name,
							version: referenceRow.currentVersion
						}
					: null,
			options: {
				draws: request.draws,
				seed: request.seed ?? randomInt(maxSeed),
				crops: request.crops,
				sharedWeather: request.sharedWeather ?? defaultComovement.sharedWeather,
				sharedMarket: request.sharedMarket ?? defaultComovement.sharedMarket
			},
			planDocument: stored.document,
			referenceDocument
		}
	};
}
