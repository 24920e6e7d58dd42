// Global set-up of the integration and e2e projects: the mail sink and the built app they run against
// (test-servers.ts). Both projects name this set-up; the second finds the app already up.
import { startTestServers, testServersAnswer, waitForTestServers } from './test-servers';

let stop: (() => Promise<void>) | undefined;

export async function setup() {
	// `npm test` has started them already, while vitest loaded: they answer within seconds.
	if (process.env.TEST_SERVERS_STARTED) return waitForTestServers(30);
	if (await testServersAnswer()) return;
	({ stop } = await startTestServers());
}

export async function teardown() {
	await stop?.();
}
