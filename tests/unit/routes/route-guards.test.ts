// Every load, form action and API handler must start by asking the one access module who may do
// what (docs: SvelteKit layout loads do not rerun per request, and +server.ts never sees a layout).
import { existsSync, readdirSync, readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { checkRouteModule, readGuards, routeServerFiles } from '../../support/route-guards';
import { publicHandlers } from './public-routes';

const guards = readGuards();
const reportsOf = (file: string) => checkRouteModule(file, readFileSync(file, 'utf8'), guards);
const names = (reports: { name: string }[]) => reports.map((report) => report.name).sort();
const unguarded = (reports: { name: string; problem?: string }[]) =>
	names(reports.filter((report) => report.problem));

describe('the guards', () => {
	it('are read from the access module, with whether each must be awaited', () => {
		expect(guards.get('requireUser')).toEqual({ async: false });
		expect(guards.get('requireSiteAdmin')).toEqual({ async: false });
		expect(guards.get('requireFarmAccess')).toEqual({ async: true });
		// Its other exports decide nothing on their own.
		expect(guards.has('roleAllows')).toBe(false);
		expect(guards.has('farmPermissions')).toBe(false);
	});
});

describe('the checker on fixtures', () => {
	const dir = 'tests/unit/routes/fixtures';
	// Every handler each fixture exports, and the ones the checker must flag.
	const expected: Record<string, { handlers: string[]; unguarded: string[] }> = {
		'load-function.unguarded': { handlers: ['load'], unguarded: ['load'] },
		'load-function.guarded': { handlers: ['load'], unguarded: [] },
		'load-arrow.unguarded': { handlers: ['load'], unguarded: ['load'] },
		'load-arrow.guarded': { handlers: ['load'], unguarded: [] },
		'actions.unguarded': {
			handlers: [
				'actions.archive',
				'actions.default',
				'actions.duplicate',
				'actions.export',
				'actions.remove',
				'actions.rename',
				'load'
			],
			unguarded: [
				'actions.archive',
				'actions.default',
				'actions.duplicate',
				'actions.export',
				'actions.remove',
				'actions.rename'
			]
		},
		'actions.guarded': {
			handlers: [
				'actions.archive',
				'actions.default',
				'actions.duplicate',
				'actions.remove',
				'actions.rename',
				'load'
			],
			unguarded: []
		},
		'handlers.unguarded': {
			handlers: ['DELETE', 'GET', 'HEAD', 'OPTIONS', 'PATCH', 'POST', 'PUT', 'fallback'],
			unguarded: ['DELETE', 'GET', 'HEAD', 'OPTIONS', 'PATCH', 'POST', 'PUT', 'fallback']
		},
		'handlers.guarded': {
			handlers: ['DELETE', 'GET', 'HEAD', 'PATCH', 'POST', 'PUT', 'fallback'],
			unguarded: []
		},
		'import-forms.guarded': { handlers: ['GET', 'POST'], unguarded: [] },
		'wrong-module.unguarded': {
			handlers: ['DELETE', 'GET', 'POST'],
			unguarded: ['DELETE', 'GET', 'POST']
		}
	};

	it('has an expectation for every fixture file', () => {
		const files = readdirSync(dir).map((file) => file.replace(/\.ts\.txt$/, ''));
		expect(files.sort()).toEqual(Object.keys(expected).sort());
	});

	it.each(Object.entries(expected))('%s: flags exactly the unguarded handlers', (name, want) => {
		const reports = checkRouteModule(
			`${name}.ts`,
			readFileSync(`${dir}/${name}.ts.txt`, 'utf8'),
			guards
		);
		expect(names(reports)).toEqual(want.handlers);
		expect(unguarded(reports)).toEqual(want.unguarded);
	});

	it('says why a handler is not guarded', () => {
		const source = readFileSync(`${dir}/handlers.unguarded.ts.txt`, 'utf8');
		const problems = new Map(
			checkRouteModule('handlers.ts', source, guards).map((r) => [r.name, r.problem])
		);
		expect(problems.get('GET')).toMatch(/expression body/);
		expect(problems.get('POST')).toMatch(/first statement/);
		expect(problems.get('OPTIONS')).toMatch(/requireFarmAccess without await/);
		expect(problems.get('fallback')).toBe('is empty');
	});
});

describe('the routes', () => {
	const files = routeServerFiles('src/routes');
	const publicOf = new Map(publicHandlers.map((entry) => [entry.file, entry.handlers]));

	it('finds the route files and handlers it checks', () => {
		expect(files).toContain('src/routes/api/v1/farms/+server.ts');
		expect(names(reportsOf('src/routes/api/v1/farms/+server.ts'))).toEqual(['GET', 'POST']);
		expect(names(reportsOf('src/routes/farms/[farmId]/settings/+page.server.ts'))).toEqual([
			'actions.default',
			'load'
		]);
	});

	it('lists only public handlers that exist, each with a reason', () => {
		for (const { file, handlers, reason } of publicHandlers) {
			expect(existsSync(file), file).toBe(true);
			expect(names(reportsOf(file)), file).toEqual(expect.arrayContaining(handlers));
			expect(reason.length).toBeGreaterThan(10);
		}
	});

	it.each(files)('%s: every handler that is not public starts with a guard', (file) => {
		const open = publicOf.get(file) ?? [];
		const problems = reportsOf(file)
			.filter((report) => report.problem && !open.includes(report.name))
			.map((report) => `${file}:${report.line} ${report.name} ${report.problem}`);
		expect(problems).toEqual([]);
	});
});
