// The sign-in limiter refuses while throttled, and refuses (and logs) when its store fails: an
// attempt it cannot count is never let through.
import { RateLimiterMemory, RateLimiterRes } from 'rate-limiter-flexible';
import { afterEach, beforeEach, describe, expect, it, vi, type MockInstance } from 'vitest';
import {
	limitedSignIn,
	signInLimits,
	SignInUnavailable,
	TooManyAttempts,
	type FailedSignInStore
} from '$lib/server/auth/sign-in-limiter';

const email = 'operator@example.test';
const address = '192.0.2.10';
const user = { id: 'u1' };
const rightPassword = vi.fn(async () => user);
const wrongPassword = vi.fn(async () => null);

/** The limiter's real rules in memory, with some steps replaced. */
function store(overrides: Partial<FailedSignInStore> = {}): FailedSignInStore {
	const memory = new RateLimiterMemory(signInLimits);
	return {
		points: memory.points,
		get: (key) => memory.get(key),
		consume: (key) => memory.consume(key),
		delete: (key) => memory.delete(key),
		...overrides
	};
}
const outage = () => Promise.reject(new Error('connect ECONNREFUSED 127.0.0.1:5432'));

let logged: MockInstance<typeof console.error>;
beforeEach(() => {
	logged = vi.spyOn(console, 'error').mockImplementation(() => {});
	rightPassword.mockClear();
	wrongPassword.mockClear();
});
afterEach(() => logged.mockRestore());

describe('limitedSignIn while the store works', () => {
	it('lets the right password in and refuses a wrong one', async () => {
		const limits = store();
		expect(await limitedSignIn(limits, email, address, rightPassword)).toBe(user);
		expect(await limitedSignIn(limits, email, address, wrongPassword)).toBeNull();
		expect(logged).not.toHaveBeenCalled();
	});

	it('after five failures refuses even the right password without checking it', async () => {
		const limits = store();
		for (let attempt = 0; attempt < 5; attempt++) {
			expect(await limitedSignIn(limits, email, address, wrongPassword)).toBeNull();
		}
		await expect(limitedSignIn(limits, email, address, rightPassword)).rejects.toBeInstanceOf(
			TooManyAttempts
		);
		expect(rightPassword).not.toHaveBeenCalled();
		// Another address is counted on its own.
		expect(await limitedSignIn(limits, email, '192.0.2.11', rightPassword)).toBe(user);
	});

	it('clears the count after the right password', async () => {
		const limits = store();
		for (let attempt = 0; attempt < 4; attempt++) {
			await limitedSignIn(limits, email, address, wrongPassword);
		}
		await limitedSignIn(limits, email, address, rightPassword);
		for (let attempt = 0; attempt < 4; attempt++) {
			await limitedSignIn(limits, email, address, wrongPassword);
		}
		expect(await limitedSignIn(limits, email, address, rightPassword)).toBe(user);
	});

	it('takes the store refusing a count past the limit as a counted failure, not an outage', async () => {
		const full = store({ consume: () => Promise.reject(new RateLimiterRes(0, 60_000, 6)) });
		expect(await limitedSignIn(full, email, address, wrongPassword)).toBeNull();
		expect(logged).not.toHaveBeenCalled();
	});
});

describe('limitedSignIn when the store fails', () => {
	it.each([
		['reading the count', store({ get: outage }), rightPassword],
		['counting a wrong password', store({ consume: outage }), wrongPassword],
		['clearing the count after the right password', store({ delete: outage }), rightPassword]
	])('refuses the sign-in and logs the error when %s fails', async (_, failing, check) => {
		const attempt = limitedSignIn(failing, email, address, check);
		await expect(attempt).rejects.toBeInstanceOf(SignInUnavailable);
		await expect(attempt).rejects.toMatchObject({ code: 'unavailable' });
		expect(logged).toHaveBeenCalledOnce();
		const [message, error] = logged.mock.calls[0];
		expect(message).toContain(email);
		expect(message).toContain(address);
		expect(error).toMatchObject({ message: 'connect ECONNREFUSED 127.0.0.1:5432' });
	});

	it('does not check the password when the count cannot be read', async () => {
		await expect(
			limitedSignIn(store({ get: outage }), email, address, rightPassword)
		).rejects.toBeInstanceOf(SignInUnavailable);
		expect(rightPassword).not.toHaveBeenCalled();
	});
});
