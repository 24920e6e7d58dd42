import { RateLimiterPostgres } from 'rate-limiter-flexible';
import { pool } from '$lib/server/db';

// Five failed attempts per address and e-mail in 15 minutes, then a wait until the window ends
// (OWASP Authentication Cheat Sheet: throttle failed log-ins; the numbers are common practice).
const MAX_FAILURES = 5;
const WINDOW_SECONDS = 15 * 60;

const limiter = new RateLimiterPostgres({
	storeClient: pool,
	storeType: 'pool',
	tableName: 'sign_in_limits',
	tableCreated: true,
	keyPrefix: 'signin',
	points: MAX_FAILURES,
	duration: WINDOW_SECONDS
});

const keyFor = (email: string, address: string) => `${email}|${address}`;

/** Seconds to wait before another attempt, or 0 when one may be made now. */
export async function secondsUntilNextAttempt(email: string, address: string): Promise<number> {
	const state = await limiter.get(keyFor(email, address));
	if (!state || state.consumedPoints < MAX_FAILURES) return 0;
	return Math.ceil(state.msBeforeNext / 1000);
}

export async function recordFailedSignIn(email: string, address: string): Promise<void> {
	// consume() rejects once the points are gone; the refusal is what we want, not an error.
	await limiter.consume(keyFor(email, address)).catch(() => undefined);
}

export async function clearFailedSignIns(email: string, address: string): Promise<void> {
	await limiter.delete(keyFor(email, address));
}
