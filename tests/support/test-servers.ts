// The local mail sink and the built app (`build/`) on the test ports, against the test database: what
// the integration and e2e files run against. The app sends its mail to the sink, which stores it in the
// test database. Global set-up starts them; `npm test` starts them sooner, with this file as a command,
// while vitest loads (about 8 s here, nearly all on one core), and global set-up waits for them:
//   node --import tsx tests/support/test-servers.ts --parent PID
// As a command it stops them on SIGINT/SIGTERM, and once the parent process (PID) has gone.
import { spawn, type ChildProcess } from 'node:child_process';
import { existsSync } from 'node:fs';
import { connect } from 'node:net';
import { pathToFileURL } from 'node:url';
import { parseArgs } from 'node:util';
import { stopWithParent } from '../../scripts/lib/stop-with-parent';
import { baseUrl } from './server';

async function appAnswers(): Promise<boolean> {
	try {
		await fetch(baseUrl, { redirect: 'manual', headers: { Connection: 'close' } });
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

async function waitFor(check: () => Promise<boolean>, what: string, seconds = 10) {
	for (let attempt = 0; attempt < seconds * 10; attempt++) {
		if (await check()) return;
		await new Promise((resolve) => setTimeout(resolve, 100));
	}
	throw new Error(`${what} did not answer`);
}

/** The ports and database the test servers use, from the environment `npm test` sets. */
function testSettings() {
	if (!process.env.TEST_PORT || !process.env.DATABASE_URL || !process.env.TEST_SMTP_PORT) {
		throw new Error(
			'Run the tests with `npm test`: it starts PostgreSQL and sets TEST_PORT, TEST_SMTP_PORT and DATABASE_URL.'
		);
	}
	return { smtpPort: Number(process.env.TEST_SMTP_PORT) };
}

export function testServersAnswer(): Promise<boolean> {
	testSettings();
	return appAnswers();
}

/** Waits until both answer: for servers another process started. */
export async function waitForTestServers(seconds: number) {
	const { smtpPort } = testSettings();
	await Promise.all([
		waitFor(appAnswers, `The app at ${baseUrl}`, seconds),
		waitFor(() => portAnswers(smtpPort), `The mail sink on port ${smtpPort}`, seconds)
	]);
}

/** Starts the sink and the app, both at once (about 2 s each here); `stop` ends what was started. */
export async function startTestServers(): Promise<{ stop: () => Promise<void> }> {
	const { smtpPort } = testSettings();
	if (!existsSync('build/index.js'))
		throw new Error('No build/ found: `npm test` builds the app first.');
	const started: ChildProcess[] = [];
	const stop = async () => {
		await Promise.all(
			started.map(
				(child) =>
					new Promise<void>((resolve) => {
						if (child.exitCode !== null || child.signalCode !== null) return resolve();
						child.once('exit', () => resolve());
						child.kill('SIGTERM');
					})
			)
		);
	};
	try {
		await Promise.all([
			(async () => {
				if (await portAnswers(smtpPort)) return;
				started.push(
					spawn(
						process.execPath,
						[
							'--import',
							'tsx',
							'scripts/mail-sink.ts',
							'--port',
							String(smtpPort),
							'--parent',
							String(process.pid)
						],
						{ env: process.env, stdio: ['ignore', 'ignore', 'inherit'] }
					)
				);
				await waitFor(() => portAnswers(smtpPort), `The mail sink on port ${smtpPort}`);
			})(),
			(async () => {
				started.push(
					// A deprecated call fails its request here rather than warning once in a log nobody
					// reads (pg 8 warns of queries queued on one connection, which pg 9 refuses).
					spawn(process.execPath, ['--throw-deprecation', 'build'], {
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
					})
				);
				await waitFor(appAnswers, `The app at ${baseUrl}`);
			})()
		]);
	} catch (error) {
		await stop();
		throw error;
	}
	return { stop };
}

// As a command: start both, and stop them with this process or its parent.
if (import.meta.url === pathToFileURL(process.argv[1] ?? '').href) {
	const { values } = parseArgs({ options: { parent: { type: 'string' } } });
	const servers = startTestServers();
	let stopping = false;
	const stopAndExit = () => {
		if (stopping) return;
		stopping = true;
		void servers.then(({ stop }) => stop()).finally(() => process.exit(0));
	};
	process.on('SIGINT', stopAndExit);
	process.on('SIGTERM', stopAndExit);
	stopWithParent(values.parent ? Number(values.parent) : undefined, stopAndExit);
	await servers;
}
