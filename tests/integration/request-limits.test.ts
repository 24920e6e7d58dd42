// A body over the server's size limit is refused with 413 and the limit, not mistaken for bad JSON.
import { readFileSync } from 'node:fs';
import { request as httpRequest } from 'node:http';
import { beforeAll, describe, expect, it } from 'vitest';
import { type Client, signedIn } from '../support/http';
import { baseUrl, demoUsers } from '../support/server';

// The test server runs with the BODY_SIZE_LIMIT of 2M that scripts/lib/bootstrap.sh sets (2 × 1024² bytes).
const LIMIT_BYTES = 2 * 1024 * 1024;
const tooLargeMessage = 'The request body is larger than the 2,048 kB limit.';

/** A real plan document padded past the limit with a long note, so only its size is wrong. */
function oversizedPlan(): string {
	const plan = JSON.parse(readFileSync('scenarios/reference.json', 'utf8'));
	plan.padding = 'x'.repeat(LIMIT_BYTES);
	return JSON.stringify(plan);
}

let lender: Client;
beforeAll(async () => {
	lender = await signedIn(demoUsers.lender);
});

// The size of each piece of a chunked body: an arbitrary size, well under the limit.
const CHUNK_BYTES = 64 * 1024;

type Answer = { status: number; body: { message: string; issues?: unknown } };

/**
 * POSTs the start of a JSON body and waits for the answer without sending the rest. The server
 * answers a body over its limit before reading all of it and closes the connection; a client still
 * writing then fails (EPIPE) before it reads the answer, as fetch does whenever the server is quicker.
 * With `declaredBytes` the request says its length up front and no body is sent at all; without, the
 * body goes chunked, `sentBytes` of it.
 */
function postUnfinished(
	client: Client,
	path: string,
	body: Uint8Array,
	{ declaredBytes, sentBytes = 0 }: { declaredBytes?: number; sentBytes?: number }
): Promise<Answer> {
	return new Promise((resolve, reject) => {
		const request = httpRequest(new URL(path, baseUrl), {
			method: 'POST',
			headers: {
				...client.requestHeaders(),
				'Content-Type': 'application/json',
				Accept: 'application/json',
				...(declaredBytes === undefined ? {} : { 'Content-Length': String(declaredBytes) })
			}
		});
		request.on('error', reject);
		request.on('response', async (response) => {
			let text = '';
			for await (const chunk of response) text += chunk;
			request.destroy();
			resolve({ status: response.statusCode ?? 0, body: JSON.parse(text) });
		});
		request.flushHeaders();
		for (let at = 0; at < sentBytes; at += CHUNK_BYTES) {
			request.write(body.subarray(at, Math.min(at + CHUNK_BYTES, sentBytes)));
		}
	});
}

describe('request body size on POST /api/v1/evaluate', () => {
	it('answers 413 naming the limit when Content-Length is over it', async () => {
		const body = new TextEncoder().encode(oversizedPlan());
		expect(body.length).toBeGreaterThan(LIMIT_BYTES);
		const answer = await postUnfinished(lender, '/api/v1/evaluate', body, {
			declaredBytes: body.length
		});
		expect(answer.status).toBe(413);
		expect(answer.body.message).toBe(tooLargeMessage);
		expect(answer.body.issues).toEqual([
			{ path: '(document)', message: 'Send a smaller document.' }
		]);
	});

	it('answers 413 when a body sent without Content-Length grows past the limit', async () => {
		const body = new TextEncoder().encode(oversizedPlan());
		// One chunk past the limit: the server must have read beyond it to refuse.
		const answer = await postUnfinished(lender, '/api/v1/evaluate', body, {
			sentBytes: Math.min(body.length, LIMIT_BYTES + CHUNK_BYTES)
		});
		expect(answer.status).toBe(413);
		expect(answer.body.message).toBe(tooLargeMessage);
	});

	it('still answers 400 for a small body that is not JSON', async () => {
		const response = await lender.json('/api/v1/evaluate', 'POST', '{ "formatVersion": 1,');
		expect(response.status).toBe(400);
		expect((await response.json()).message).toBe('The request body is not valid JSON.');
	});
});
