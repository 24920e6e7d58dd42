import { json } from '@sveltejs/kit';
import { tradeOffSchema } from '$lib/schemas/optimise';
import { invalidInput, readJson } from '$lib/server/api';
import { requirePlanAccess } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import { tradeOffCurve } from '$lib/server/optimiser/optimise';
import { storedPlanDocument } from '$lib/server/plans';
import type { RequestHandler } from './$types';

/**
 * A trade-off curve: net return as one limit (family hours in a span of months, or purchased N) is
 * swept. Streams `application/x-ndjson`, one line per event: `progress`, each `point` as it is solved,
 * then `done` with where the plan as it stands falls (or `error`). Bad options: 422 before any line.
 */
export const POST: RequestHandler = async (event) => {
	const { farm, plan } = await requirePlanAccess(
		event,
		event.params.farmId,
		event.params.planId,
		'farm:view'
	);
	const body = await readJson(event.request);
	if (!body.ok) return body.response;
	const request = tradeOffSchema.safeParse(body.body);
	if (!request.success) return invalidInput(request.error);
	const stored = await storedPlanDocument(db, farm, plan);
	if (!stored.ok) return stored.response;
	const curve = tradeOffCurve(stored.document, request.data);
	if (!curve.ok) {
		return json(
			{ message: 'The options do not fit the plan.', issues: curve.issues },
			{ status: 422 }
		);
	}
	const encoder = new TextEncoder();
	const stream = new ReadableStream<Uint8Array>({
		async start(controller) {
			const send = (line: unknown) =>
				controller.enqueue(encoder.encode(JSON.stringify(line) + '\n'));
			try {
				await curve.run(send);
			} catch (error) {
				send({
					type: 'error',
					message: error instanceof Error ? error.message : 'The solver failed.'
				});
			}
			controller.close();
		}
	});
	return new Response(stream, {
		headers: { 'content-type': 'application/x-ndjson; charset=utf-8', 'cache-control': 'no-store' }
	});
};
