// One Chromium for the whole e2e run (starting one takes seconds on a busy machine); each test file
// connects to it and opens contexts of its own, which share no cookies or storage.
import { chromium, type BrowserServer } from 'playwright-core';
import type { TestProject } from 'vitest/node';

declare module 'vitest' {
	export interface ProvidedContext {
		browserEndpoint: string;
	}
}

let server: BrowserServer | undefined;

export async function setup(project: TestProject) {
	// Debian's Chromium; the flags keep it off the (closed) network.
	server = await chromium.launchServer({
		executablePath: '/usr/bin/chromium',
		headless: true,
		args: [
			'--no-sandbox',
			'--disable-gpu',
			'--disable-quic',
			'--no-first-run',
			'--disable-background-networking',
			'--disable-component-update',
			'--disable-sync'
		]
	});
	project.provide('browserEndpoint', server.wsEndpoint());
}

export async function teardown() {
	await server?.close();
}
