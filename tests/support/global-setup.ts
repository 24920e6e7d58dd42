// Starts the local mail sink and the built app (`build/`) against the test database for the
// integration and e2e projects. The app sends its mail to the sink, which stores it in the test database.
import { spawn, type ChildProcess } from 'node:child_process';
import { existsSync } from 'node:fs';
import { connect } from 'node:net';
import { baseUrl } from './server';

let server: ChildProcess | undefined;
let mailSink: ChildProcess | undefined;

async function answers(): Promise<boolean> {
	try {
		await fetch(baseUrl, { redirect: 'manual' });
		return true;
	} catch {
		return false;
	}
}

function portAnswers(port: number): Promise<boolean> {
	return new Promise((resolve) => {
		const socket = connect(port, '127.0.0.1');
		socket.once('connect', () => {
			socket.destroy();
			resolve(true);
		});
		socket.once('error', () => resolve(false));
	});
}

async function waitFor(check: () => Promise<boolean>, what: string) {
	for (let attempt = 0; attempt < 100; attempt++) {
		if (await check()) return;
		await new Promise((resolve) => setTimeout(resolve, 100));
	}
	throw new Error(`${what} did not answer`);
}

/** The sink on TEST_SMTP_PORT, stopping by itself if this process goes without a teardown. */
async function startMailSink(port: number) {
	if (await portAnswers(port)) return;
	mailSink = spawn(
		process.execPath,
		[
			'--import',
			'tsx',
			'scripts/mail-sink.ts',
			'--port',
			String(port),
			'--parent',
			String(process.pid)
		],
		{ env: process.env, stdio: ['ignore', 'ignore', 'inherit'] }
	);
	await waitFor(() => portAnswers(port), `The mail sink on port ${port}`);
}

export async function setup() {
	if (!process.env.TEST_PORT || !process.env.DATABASE_URL || !process.env.TEST_SMTP_PORT) {
		throw new Error(
			'Run the tests with `npm test`: it starts PostgreSQL and sets TEST_PORT, TEST_SMTP_PORT and DATABASE_URL.'
		);
	}
	// Both projects name this set-up; the second finds the server already up.
	if (await answers()) return;
	if (!existsSync('build/index.js'))
		throw new Error('No build/ found: `npm test` builds the app first.');
	const smtpPort = Number(process.env.TEST_SMTP_PORT);
	// Both at once (about 2 s each on this machine): the app only reaches the sink when it sends mail.
	await Promise.all([startMailSink(smtpPort), startApp(smtpPort)]);
}

async function startApp(smtpPort: number) {
	server = spawn(process.execPath, ['build'], {
		env: {
			...process.env,
			PORT: process.env.TEST_PORT,
			HOST: '127.0.0.1',
			ORIGIN: baseUrl,
			SMTP_HOST: '127.0.0.1',
			SMTP_PORT: String(smtpPort),
			SMTP_SECURE: 'false',
			SMTP_USER: '',
			SMTP_PASSWORD: ''
		},
		stdio: ['ignore', 'inherit', 'inherit']
	});
	await waitFor(answers, `The app at ${baseUrl}`);
}

export async function teardown() {
	server?.kill('SIGTERM');
	mailSink?.kill('SIGTERM');
}
