// Starts the built app (`build/`) against the test database for the integration and e2e projects.
import { spawn, type ChildProcess } from 'node:child_process';
import { existsSync } from 'node:fs';
import { baseUrl } from './server';

let server: ChildProcess | undefined;

async function answers(): Promise<boolean> {
	try {
		await fetch(baseUrl, { redirect: 'manual' });
		return true;
	} catch {
		return false;
	}
}

export async function setup() {
	if (!process.env.TEST_PORT || !process.env.DATABASE_URL) {
		throw new Error(
			'Run the tests with `npm test`: it starts PostgreSQL and sets TEST_PORT and DATABASE_URL.'
		);
	}
	// Both projects name this set-up; the second finds the server already up.
	if (await answers()) return;
	if (!existsSync('build/index.js'))
		throw new Error('No build/ found: `npm test` builds the app first.');
	server = spawn(process.execPath, ['build'], {
		env: { ...process.env, PORT: process.env.TEST_PORT, HOST: '127.0.0.1', ORIGIN: baseUrl },
		stdio: ['ignore', 'inherit', 'inherit']
	});
	for (let attempt = 0; attempt < 100; attempt++) {
		if (await answers()) return;
		await new Promise((resolve) => setTimeout(resolve, 100));
	}
	throw new Error(`The app did not answer at ${baseUrl}`);
}

export async function teardown() {
	server?.kill('SIGTERM');
}
