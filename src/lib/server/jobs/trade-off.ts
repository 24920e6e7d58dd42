// The optimiser's trade-off curve as a queued job: the plan file is taken when the curve is asked for
// (so a later edit does not change a run under way), each point is solved in turn with progress saved
// as it comes, and the points are the job's output, written by the queue in the one statement that
// completes the job.
import type { TradeOffLine, TradeOffPoint } from '$lib/engine/optimiser/types';
import type { TradeOffRequest } from '$lib/schemas/optimise';
import type { PlanDocument } from '$lib/schemas/plan-file';
import { optionsRefused } from '$lib/server/api';
import { db } from '$lib/server/db';
import { recordJobStart, saveJobProgress } from '$lib/server/db/jobs';
import type { PlanRow } from '$lib/server/db/plans';
import { tradeOffCurve } from '$lib/server/optimiser/optimise';
import { WorkerStopping, type PlanRef } from './monte-carlo';
import { workerName, type JobOwner } from './queue';

export interface TradeOffJobData extends JobOwner {
	plan: PlanRef;
	request: TradeOffRequest;
	planDocument: PlanDocument;
}

export interface TradeOffJobResult {
	planVersion: number;
	sweep: TradeOffRequest['sweep'];
	/** The curve's points in the order of the swept limit, as the streamed route sends them. */
	points: TradeOffPoint[];
	/** Where the plan as it stands falls: its largest use of the swept limit and its net return. */
	current: { limit: number; netReturnUsd: number };
}

export async function runTradeOffJob(
	jobId: string,
	data: TradeOffJobData,
	isStopping: () => boolean
): Promise<TradeOffJobResult> {
	const curve = tradeOffCurve(data.planDocument, data.request);
	// Checked when the job was asked for; a plan file that no longer builds fails the job, saying why.
	if (!curve.ok) throw new Error(curve.issues.map((i) => `${i.path}: ${i.message}`).join('; '));
	await recordJobStart(db, jobId, data.request.sweep.points, workerName);
	const points: TradeOffPoint[] = [];
	let current: TradeOffJobResult['current'] | undefined;
	// Progress rows are written one after another, never two at once out of order.
	let saving = Promise.resolve();
	await curve.run((line: TradeOffLine) => {
		if (line.type === 'point') points[line.index] = line.point;
		else if (line.type === 'progress' && line.done > 0) {
			saving = saving.then(() => saveJobProgress(db, jobId, line.done));
		} else if (line.type === 'done') current = line.current;
	});
	await saving;
	// The solver runs in a worker thread of its own and is not stopped part-way: a server stopping
	// while it ran fails the job here, so that it runs again from the start rather than half-saved.
	if (isStopping()) throw new WorkerStopping();
	if (
		!current ||
		[...points, ...Array(data.request.sweep.points - points.length)].some((p) => !p)
	) {
		throw new Error('The solver did not answer every point of the curve.');
	}
	return { planVersion: data.plan.version, sweep: data.request.sweep, points, current };
}

type Asked = { ok: true; data: TradeOffJobData } | { ok: false; response: Response };

/**
 * A trade-off curve asked for on a plan's newest version: options that do not fit the plan are
 * refused with 422 now, as the streamed route refuses them, rather than failing the job later.
 */
export function tradeOffJobData(
	farmId: string,
	plan: PlanRow,
	userId: string,
	request: TradeOffRequest,
	planDocument: PlanDocument
): Asked {
	const curve = tradeOffCurve(planDocument, request);
	if (!curve.ok) return { ok: false, response: optionsRefused(curve.issues) };
	return {
		ok: true,
		data: {
			farmId,
			planId: plan.id,
			userId,
			plan: { planId: plan.id, name: plan.name, version: plan.currentVersion },
			request,
			planDocument
		}
	};
}
