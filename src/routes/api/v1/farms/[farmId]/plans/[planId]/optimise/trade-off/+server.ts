import { tradeOffSchema } from '$lib/schemas/optimise';
import { optionsRefused } from '$lib/server/api';
import { requirePlanAccess } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import { tradeOffCurve } from '$lib/server/optimiser/optimise';
import { planDocumentRequest } from '$lib/server/plans';
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
	const asked = await planDocumentRequest(db, farm, plan, event.request, tradeOffSchema);
	if (!asked.ok) return asked.response;
	const { body: request, document } = asked;
	const curve = tradeOffCurve(document, request);
	if (!curve.ok) {
		return optionsRefused(curve.issues);
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
