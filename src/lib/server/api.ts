import { json } from '@sveltejs/kit';
import type { z } from 'zod';
import { toFieldIssues, type FieldIssue } from '$lib/schemas/issues';

/** The API's answer to input it cannot accept: 422 with each problem named by its path. */
export function invalidInput(error: z.ZodError) {
	return json(
		{ message: 'The input is not valid.', issues: toFieldIssues(error) },
		{ status: 422 }
	);
}

/** The same 422 for a problem only the database can see (an id another row already has). */
export function invalidValue(path: string, message: string) {
	return json({ message: 'The input is not valid.', issues: [{ path, message }] }, { status: 422 });
}

/** 422: options that name what the plan does not have (a crop, a field, a rotation). */
export function optionsRefused(issues: FieldIssue[]) {
	return json({ message: 'The options do not fit the plan.', issues }, { status: 422 });
}

/** 409: the request is valid but the farm's data refuses it (a field a plan uses); `detail` names what. */
export function conflict(message: string, detail: Record<string, unknown> = {}) {
	return json({ message, issues: [{ path: '(document)', message }], ...detail }, { status: 409 });
}

/**
 * Reads a JSON body. A body over the server's size limit (adapter-node's BODY_SIZE_LIMIT) is a 413
 * that names the limit; a body that is not JSON is a 400 with a plain message, not a crash.
 */
export async function readJson(
	request: Request
): Promise<{ ok: true; body: unknown } | { ok: false; response: Response }> {
	try {
		return { ok: true, body: await request.json() };
	} catch (err) {
		if (!isTooLarge(err)) {
			return refuse(400, 'The request body is not valid JSON.', 'Send a JSON document.');
		}
		const limit = limitBytes(err.message);
		const size =
			limit === undefined ? 'than this server accepts' : `than the ${formatKb(limit)} limit`;
		return refuse(413, `The request body is larger ${size}.`, 'Send a smaller document.');
	}
}

function refuse(status: number, message: string, hint: string) {
	const issues = [{ path: '(document)', message: hint }];
	return { ok: false as const, response: json({ message, issues }, { status }) };
}

/** SvelteKit's node adapter fails the body stream with an error carrying status 413. */
function isTooLarge(err: unknown): err is Error & { status: 413 } {
	return err instanceof Error && (err as { status?: unknown }).status === 413;
}

/**
 * The limit from SvelteKit's message ("Content-length of N exceeds limit of L bytes." or "request
 * body size exceeded BODY_SIZE_LIMIT of L"): the limit it applied, whatever the setting's form.
 */
function limitBytes(message: string): number | undefined {
	const match = /(?:limit of|BODY_SIZE_LIMIT of) (\d+)/.exec(message);
	return match ? Number(match[1]) : undefined;
}

/** adapter-node counts K as 1024 bytes, so 512K reads back as "512 kB". */
function formatKb(bytes: number): string {
	return `${Math.round(bytes / 1024).toLocaleString('en-US')} kB`;
}
