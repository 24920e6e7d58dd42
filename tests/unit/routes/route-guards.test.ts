// Every server handler that reads or changes farm data must ask the one access module first.
import { readFileSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';

const GUARDS = /require(User|SiteAdmin|FarmAccess)\(/;
// Sign-in, registration and sign-out are how a visitor becomes a user; they cannot require one.
const PUBLIC_ROUTES = new Set([
	'src/routes/signin',
	'src/routes/register',
	'src/routes/signout',
	'src/routes'
]);

function serverFiles(dir: string): string[] {
	return readdirSync(dir, { withFileTypes: true }).flatMap((entry) => {
		const path = join(dir, entry.name);
		if (entry.isDirectory()) return serverFiles(path);
		return /^\+(page|layout)\.server\.ts$|^\+server\.ts$/.test(entry.name) ? [path] : [];
	});
}

/** The source of each exported handler: `export const GET…`, `load`, and each named form action. */
function handlers(source: string): [string, string][] {
	const found: [string, string][] = [];
	const exportPattern = /export const (\w+)(?::[^=]+)? = /g;
	const starts = [...source.matchAll(exportPattern)];
	starts.forEach((match, i) => {
		const end = i + 1 < starts.length ? starts[i + 1].index : source.length;
		const body = source.slice(match.index, end);
		if (match[1] === 'actions') {
			const actions = [...body.matchAll(/^\t(\w+): async/gm)];
			actions.forEach((action, j) => {
				const actionEnd = j + 1 < actions.length ? actions[j + 1].index : body.length;
				found.push([`actions.${action[1]}`, body.slice(action.index, actionEnd)]);
			});
		} else {
			found.push([match[1], body]);
		}
	});
	return found;
}

const files = serverFiles('src/routes').filter(
	(file) => !PUBLIC_ROUTES.has(file.slice(0, file.lastIndexOf('/')))
);

describe('route guards', () => {
	it('finds the route files it checks', () => {
		expect(files).toContain('src/routes/api/v1/farms/+server.ts');
		expect(files).toContain('src/routes/farms/[farmId]/settings/+page.server.ts');
	});

	it.each(files)(
		'%s: every handler calls requireUser, requireSiteAdmin or requireFarmAccess',
		(file) => {
			const source = readFileSync(file, 'utf8');
			const list = handlers(source).filter(([name]) => name !== 'prerender');
			const unguarded = list.filter(([, body]) => !GUARDS.test(body)).map(([name]) => name);
			expect(unguarded).toEqual([]);
		}
	);
});
