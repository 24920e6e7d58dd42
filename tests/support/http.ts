import { baseUrl, DEMO_PASSWORD } from './server';

/**
 * A signed-in (or anonymous) client: keeps its cookies and sends the Origin SvelteKit checks on POSTs.
 * Every request has a connection of its own: a socket kept alive could be closed by the server
 * (adapter-node's KEEP_ALIVE_TIMEOUT, 5 s) while this process is busy, and the next request sent on it
 * would fail with `SocketError: other side closed`.
 */
export class Client {
	private cookies = new Map<string, string>();

	/** `base`: another app server than the tests' own (one a test starts itself). */
	constructor(private readonly base = baseUrl) {}

	/** The same person (the same session cookies) on another app server. */
	on(base: string): Client {
		const other = new Client(base);
		for (const [name, value] of this.cookies) other.cookies.set(name, value);
		return other;
	}

	/** What every request of this client carries: the Origin, no kept-alive socket, its cookies. */
	requestHeaders(): Record<string, string> {
		return {
			Origin: this.base,
			Connection: 'close',
			...(this.cookies.size
				? { Cookie: [...this.cookies].map(([k, v]) => `${k}=${v}`).join('; ') }
				: {})
		};
	}

	async fetch(path: string, init: RequestInit = {}): Promise<Response> {
		const headers = new Headers(init.headers);
		for (const [name, value] of Object.entries(this.requestHeaders())) headers.set(name, value);
		const response = await fetch(this.base + path, { ...init, headers, redirect: 'manual' });
		for (const cookie of response.headers.getSetCookie()) {
			const [pair] = cookie.split(';');
			const [name, ...value] = pair.split('=');
			if (value.join('=') === '') this.cookies.delete(name);
			else this.cookies.set(name, value.join('='));
		}
		return response;
	}

	/** Posts a form the way a browser without JavaScript does. */
	postForm(path: string, fields: Record<string, string | string[]>): Promise<Response> {
		const body = new URLSearchParams();
		for (const [key, value] of Object.entries(fields)) {
			for (const item of Array.isArray(value) ? value : [value]) body.append(key, item);
		}
		return this.fetch(path, { method: 'POST', body, headers: { Accept: 'text/html' } });
	}

	/** Calls a form action the way `use:enhance` does: JSON answer with `type` and `status`. */
	async action(path: string, fields: Record<string, string | string[]>) {
		const body = new URLSearchParams();
		for (const [key, value] of Object.entries(fields)) {
			for (const item of Array.isArray(value) ? value : [value]) body.append(key, item);
		}
		const response = await this.fetch(path, {
			method: 'POST',
			body,
			headers: { Accept: 'application/json', 'x-sveltekit-action': 'true' }
		});
		return (await response.json()) as {
			type: string;
			status: number;
			data?: string;
			location?: string;
		};
	}

	json(path: string, method: string, body: unknown): Promise<Response> {
		return this.fetch(path, {
			method,
			body: typeof body === 'string' ? body : JSON.stringify(body),
			headers: { 'Content-Type': 'application/json', Accept: 'application/json' }
		});
	}

	/** The cookies this client holds, for a browser context to start signed in as the same person. */
	cookieList(): { name: string; value: string }[] {
		return [...this.cookies].map(([name, value]) => ({ name, value }));
	}

	hasSession(): boolean {
		return [...this.cookies.keys()].some((name) => name.includes('authjs.session-token'));
	}

	async signIn(email: string, password = DEMO_PASSWORD): Promise<Response> {
		return this.postForm('/signin', {
			providerId: 'credentials',
			redirectTo: '/farms',
			email,
			password
		});
	}
}

export async function signedIn(email: string): Promise<Client> {
	const client = new Client();
	const response = await client.signIn(email);
	if (!client.hasSession())
		throw new Error(`sign-in as ${email} failed with HTTP ${response.status}`);
	return client;
}

export const uniqueEmail = (label: string) =>
	`${label}-${crypto.randomUUID().slice(0, 8)}@example.test`;

/** A new account of its own, signed in, for tests that create or change things. */
export async function registerUser(label: string) {
	const client = new Client();
	const email = uniqueEmail(label);
	const password = 'a-long-test-password';
	await client.postForm('/register', {
		providerId: 'credentials',
		name: `Test ${label}`,
		email,
		password,
		confirmPassword: password
	});
	if (!client.hasSession()) throw new Error(`registering a ${label} user failed`);
	return { client, email };
}

export async function newUser(label: string): Promise<Client> {
	return (await registerUser(label)).client;
}
