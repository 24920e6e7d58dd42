import { CredentialsSignin } from '@auth/sveltekit';
import type { Pool } from 'pg';
import {
	RateLimiterPostgres,
	RateLimiterRes,
	type RateLimiterAbstract
} from 'rate-limiter-flexible';

// Five failed attempts per address and e-mail in 15 minutes, then a wait until the window ends
// (OWASP Authentication Cheat Sheet: throttle failed log-ins; the numbers are common practice).
export const signInLimits = { points: 5, duration: 15 * 60 };

/** Too many failed attempts for this e-mail from this address: wait for the window to end. */
export class TooManyAttempts extends CredentialsSignin {
	code = 'throttled';
}

/** The count of failed attempts could not be read or written, so no attempt is allowed. */
export class SignInUnavailable extends CredentialsSignin {
	code = 'unavailable';
}

/** What the limiter needs from its store; rate-limiter-flexible's limiters provide it. */
export type FailedSignInStore = Pick<RateLimiterAbstract, 'points' | 'get' | 'consume' | 'delete'>;

/** The failed-attempt counts, kept in PostgreSQL so every app server sees the same ones. */
export function postgresFailedSignIns(pool: Pool): FailedSignInStore {
	return new RateLimiterPostgres({
		storeClient: pool,
		storeType: 'pool',
		tableName: 'sign_in_limits',
		tableCreated: true,
		keyPrefix: 'signin',
		...signInLimits
	});
}

/**
 * Runs one password check under the limit. While the e-mail and address are throttled the check
 * does not run; a wrong password counts against them, a right one clears the count. When the store
 * fails the attempt is refused and the error logged: an uncounted attempt would let guessing go on
 * without limit, and answering only right passwords would tell a guesser which one was right.
 */
export async function limitedSignIn<User>(
	store: FailedSignInStore,
	email: string,
	address: string,
	checkPassword: () => Promise<User | null>
): Promise<User | null> {
	const key = `${email}|${address}`;
	const storeStep = async <T>(step: string, run: () => Promise<T>): Promise<T> => {
		try {
			return await run();
		} catch (err) {
			console.error(`Sign-in refused for ${email} from ${address}: could not ${step}.`, err);
			throw new SignInUnavailable();
		}
	};

	const failures = await storeStep('read the failed attempts', () => store.get(key));
	if (failures && failures.consumedPoints >= store.points) throw new TooManyAttempts();
	const user = await checkPassword();
	if (user) {
		await storeStep('clear the failed attempts', () => store.delete(key));
	} else {
		// consume() rejects with the limiter's answer once the points are gone: the count is kept.
		await storeStep('count the failed attempt', () =>
			store.consume(key).catch((rejection: unknown) => {
				if (rejection instanceof RateLimiterRes) return rejection;
				throw rejection;
			})
		);
	}
	return user;
}

// Sign-in links: five requests per e-mail address an hour, so nobody can fill someone's inbox
// (common practice, no published source for the numbers).
export const signInLinkLimits = { points: 5, duration: 60 * 60 };

/** The sign-in link requests per e-mail, kept in PostgreSQL beside the failed sign-ins. */
export function postgresSignInLinkRequests(pool: Pool): Pick<RateLimiterAbstract, 'consume'> {
	return new RateLimiterPostgres({
		storeClient: pool,
		storeType: 'pool',
		tableName: 'sign_in_limits',
		tableCreated: true,
		keyPrefix: 'signin-link',
		...signInLinkLimits
	});
}

/** Counts one link request: `ok`, `throttled` once the hour's requests are used, `unavailable` on a store error. */
export async function countSignInLinkRequest(
	store: Pick<RateLimiterAbstract, 'consume'>,
	email: string
): Promise<'ok' | 'throttled' | 'unavailable'> {
	try {
		await store.consume(email);
		return 'ok';
	} catch (rejection) {
		if (rejection instanceof RateLimiterRes) return 'throttled';
		console.error(`Sign-in link for ${email} refused: could not count the request.`, rejection);
		return 'unavailable';
	}
}
