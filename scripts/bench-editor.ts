/**
 * The plan editor in Chromium, for `npm run bench`: the time from a changed rotation to new numbers on
 * screen, on the demo farm's reference plan. Starts the built app (build/) on a free port against the
 * database in the environment or .env, signs in as the demo owner and changes one field's rotation back
 * and forth without saving, so the demo data stays as seeded.
 */
import './db/load-env';
import { spawn } from 'node:child_process';
import { existsSync } from 'node:fs';
import { createServer } from 'node:net';
import type { Page } from 'playwright-core';

const demoFarmName = 'Maple Coulee Farm';
const editCount = 20;
const answerTimeoutMs = 10_000;
const appStartTimeoutMs = 30_000;

export interface EditorTimings {
	fieldCount: number;
	yearCount: number;
	fieldName: string;
	/** From each change of the field's rotation to its new numbers on screen, ms. */
	editMs: number[];
}

function freePort(): Promise<number> {
	return new Promise((resolve, reject) => {
		const probe = createServer();
		probe.once('error', reject);
		probe.listen(0, '127.0.0.1', () => {
			const address = probe.address();
			probe.close(() =>
				typeof address === 'object' && address
					? resolve(address.port)
					: reject(new Error('no port'))
			);
		});
	});
}

/** `node build` on `port`, as the tests' global set-up starts it; resolves once it answers. */
async function startApp(port: number, baseUrl: string): Promise<() => Promise<void>> {
	const app = spawn(process.execPath, ['build'], {
		env: { ...process.env, PORT: String(port), HOST: '127.0.0.1', ORIGIN: baseUrl },
		stdio: ['ignore', 'ignore', 'inherit']
	});
	const exited = new Promise<void>((resolve) => app.once('exit', () => resolve()));
	const stop = async () => {
		if (app.exitCode !== null || app.signalCode !== null) return;
		app.kill('SIGTERM');
		const killer = setTimeout(() => app.kill('SIGKILL'), 5_000);
		await exited;
		clearTimeout(killer);
	};
	const deadline = Date.now() + appStartTimeoutMs;
	while (Date.now() < deadline) {
		if (app.exitCode !== null) throw new Error(`The app exited with status ${app.exitCode}`);
		try {
			await fetch(baseUrl, { redirect: 'manual' });
			return stop;
		} catch {
			await new Promise((resolve) => setTimeout(resolve, 100));
		}
	}
	await stop();
	throw new Error(`The app did not answer at ${baseUrl}`);
}

type BenchWindow = Window & { benchEdit?: Promise<number> };

/**
 * In the page, before a change: notes the answers shown and the net return row, then times from the
 * next change event (captured before the editor's own handler) until a new answer is shown with a
 * different net return row, and on to the frame that paints it. No named inner functions: tsx would
 * wrap them in a helper the page does not have.
 */
function armEdit(timeoutMs: number) {
	const answeredBefore = document.querySelector('[data-answered]')?.getAttribute('data-answered');
	const netReturnBefore = document.querySelector('tr[data-row="netReturn"]')?.textContent;
	let changedAt: number | undefined;
	document.addEventListener('change', () => (changedAt = performance.now()), {
		capture: true,
		once: true
	});
	(window as BenchWindow).benchEdit = new Promise<number>((resolve, reject) => {
		const timer = setTimeout(() => {
			observer.disconnect();
			reject(new Error(`no new net return on screen within ${timeoutMs} ms of the change`));
		}, timeoutMs);
		const observer = new MutationObserver(() => {
			const answered = document.querySelector('[data-answered]')?.getAttribute('data-answered');
			const netReturn = document.querySelector('tr[data-row="netReturn"]')?.textContent;
			if (changedAt === undefined) return;
			if (Number(answered) <= Number(answeredBefore) || netReturn === netReturnBefore) return;
			observer.disconnect();
			clearTimeout(timer);
			const start = changedAt;
			// The callback after the next animation frame runs once that frame is painted.
			requestAnimationFrame(() => setTimeout(() => resolve(performance.now() - start)));
		});
		observer.observe(document.body, {
			subtree: true,
			childList: true,
			characterData: true,
			attributes: true,
			attributeFilter: ['data-answered']
		});
	});
}

/** The editor's address for the demo farm's reference plan, from the plans API as the owner sees it. */
async function referencePlanPath(page: Page): Promise<string> {
	return page.evaluate(async (farmName) => {
		const { farms } = (await (await fetch('/api/v1/farms')).json()) as {
			farms: { id: string; name: string; role: string }[];
		};
		const farm = farms.find((f) => f.name === farmName && f.role === 'owner');
		if (!farm) throw new Error(`The demo owner has no farm named ${farmName}: is the demo seeded?`);
		const { plans } = (await (await fetch(`/api/v1/farms/${farm.id}/plans`)).json()) as {
			plans: { id: string; isReference: boolean }[];
		};
		const reference = plans.find((p) => p.isReference);
		if (!reference) throw new Error(`${farmName} has no reference plan`);
		return `/farms/${farm.id}/plans/${reference.id}`;
	}, demoFarmName);
}

async function timeEdits(page: Page): Promise<EditorTimings> {
	await page.goto(await referencePlanPath(page));
	await page.locator('tr[data-row="netReturn"] td').first().waitFor();
	const row = page.locator('tr[data-field]').first();
	const fieldName = (await row.locator('th[scope="row"] span').first().textContent()) ?? '';
	const rotation = row.getByLabel(/^Rotation of /);
	const original = await rotation.inputValue();
	const choices = await rotation
		.locator('option')
		.evaluateAll((options) => options.map((o) => (o as HTMLOptionElement).value));
	const other = choices.find((value) => value && value !== original);
	if (!other) throw new Error(`${fieldName} has no other rotation to switch to`);
	// Back and forth between two rotations, so that every edit changes the numbers.
	const editMs: number[] = [];
	for (let i = 0; i < editCount; i++) {
		await page.evaluate(armEdit, answerTimeoutMs);
		await rotation.selectOption(i % 2 === 0 ? other : original);
		editMs.push(await page.evaluate(() => (window as BenchWindow).benchEdit!));
	}
	return {
		fieldCount: await page.locator('tr[data-field]').count(),
		yearCount: await page.locator('tr[data-row="netReturn"] td').count(),
		fieldName,
		editMs
	};
}

export async function editorTimings(): Promise<EditorTimings> {
	if (!existsSync('build/index.js')) {
		throw new Error('No build/ found: `npm run bench` builds the app first (or `npm run build`).');
	}
	if (!process.env.DATABASE_URL) {
		throw new Error('DATABASE_URL is not set: run `npm run bench`, which reads .env.');
	}
	const port = await freePort();
	// The tests' browser helpers read the app's port when first imported.
	process.env.TEST_PORT = String(port);
	const { openBrowser, signInAs } = await import('../tests/support/browser');
	const { baseUrl, demoUsers } = await import('../tests/support/server');
	const stopApp = await startApp(port, baseUrl);
	let closeBrowser: (() => Promise<void>) | undefined;
	try {
		const browser = await openBrowser();
		closeBrowser = browser.close;
		const page = await browser.context.newPage();
		await signInAs(page, demoUsers.owner);
		await page.waitForURL('**/farms');
		return await timeEdits(page);
	} finally {
		await closeBrowser?.();
		await stopApp();
	}
}
