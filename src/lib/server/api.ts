import { json } from '@sveltejs/kit';
import type { z } from 'zod';
import { toFieldIssues } from '$lib/schemas/issues';

/** The API's answer to input it cannot accept: 422 with each problem named by its path. */
export function invalidInput(error: z.ZodError) {
	return json(
		{ message: 'The input is not valid.', issues: toFieldIssues(error) },
		{ status: 422 }
	);
}

/** Reads a JSON body; a body that is not JSON is a 400 with a plain message, not a crash. */
export async function readJson(
	request: Request
): Promise<{ ok: true; body: unknown } | { ok: false; response: Response }> {
	try {
		return { ok: true, body: await request.json() };
	} catch {
		return {
			ok: false,
			response: json(
				{
					message: 'The request body is not valid JSON.',
					issues: [{ path: '(document)', message: 'Send a JSON document.' }]
				},
				{ status: 400 }
			)
		};
	}
}
