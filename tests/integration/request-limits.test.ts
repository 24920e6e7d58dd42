// A body over the server's size limit is refused with 413 and the limit, not mistaken for bad JSON.
import { readFileSync } from 'node:fs';
import { beforeAll, describe, expect, it } from 'vitest';
import { type Client, signedIn } from '../support/http';
import { demoUsers } from '../support/server';

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

describe('request body size on POST /api/v1/evaluate', () => {
	it('answers 413 naming the limit when Content-Length is over it', async () => {
		const body = oversizedPlan();
		expect(Buffer.byteLength(body)).toBeGreaterThan(LIMIT_BYTES);
		const response = await lender.json('/api/v1/evaluate', 'POST', body);
		expect(response.status).toBe(413);
		const answer = await response.json();
		expect(answer.message).toBe(tooLargeMessage);
		expect(answer.issues).toEqual([{ path: '(document)', message: 'Send a smaller document.' }]);
	});

	it('answers 413 when a body sent without Content-Length grows past the limit', async () => {
		const bytes = new TextEncoder().encode(oversizedPlan());
		const chunkBytes = 64 * 1024;
		const stream = new ReadableStream<Uint8Array>({
			start(controller) {
				for (let at = 0; at < bytes.length; at += chunkBytes) {
					controller.enqueue(bytes.subarray(at, at + chunkBytes));
				}
				controller.close();
			}
		});
		const response = await lender.fetch('/api/v1/evaluate', {
			method: 'POST',
			body: stream,
			headers: { 'Content-Type': 'application/json', Accept: 'application/json' },
			duplex: 'half'
		} as RequestInit);
		expect(response.status).toBe(413);
		expect((await response.json()).message).toBe(tooLargeMessage);
	});

	it('still answers 400 for a small body that is not JSON', async () => {
		const response = await lender.json('/api/v1/evaluate', 'POST', '{ "formatVersion": 1,');
		expect(response.status).toBe(400);
		expect((await response.json()).message).toBe('The request body is not valid JSON.');
	});
});
