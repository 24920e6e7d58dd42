// docs/api.md documents every API route: each method each +server.ts under src/routes/api exports has
// a heading "### METHOD /path" there, with an example request and answer, and no heading names a route
// that does not exist.
import { readdirSync, readFileSync } from 'node:fs';
import { join, relative, sep } from 'node:path';
import ts from 'typescript';
import { describe, expect, it } from 'vitest';

const apiDir = 'src/routes/api';
const methods = new Set(['GET', 'POST', 'PUT', 'PATCH', 'DELETE', 'OPTIONS', 'HEAD', 'fallback']);

function serverFiles(dir: string): string[] {
	return readdirSync(dir, { withFileTypes: true }).flatMap((entry) => {
		const path = join(dir, entry.name);
		if (entry.isDirectory()) return serverFiles(path);
		return entry.name === '+server.ts' ? [path] : [];
	});
}

/** The request handlers a route module exports (`export const GET`, `export async function POST`…). */
function exportedMethods(source: string): string[] {
	const file = ts.createSourceFile('+server.ts', source, ts.ScriptTarget.Latest, true);
	const found: string[] = [];
	for (const statement of file.statements) {
		const exported = ts
			.getModifiers(statement as ts.HasModifiers)
			?.some((m) => m.kind === ts.SyntaxKind.ExportKeyword);
		if (!exported) continue;
		if (ts.isVariableStatement(statement)) {
			for (const d of statement.declarationList.declarations) {
				if (ts.isIdentifier(d.name) && methods.has(d.name.text)) found.push(d.name.text);
			}
		} else if (ts.isFunctionDeclaration(statement) && statement.name) {
			if (methods.has(statement.name.text)) found.push(statement.name.text);
		}
	}
	return found.sort();
}

/** `src/routes/api/v1/farms/[farmId]/+server.ts` → `/api/v1/farms/[farmId]` (groups `(x)` dropped). */
function routePath(file: string): string {
	const segments = relative('src/routes', file).split(sep).slice(0, -1);
	return '/' + segments.filter((s) => !/^\(.*\)$/.test(s)).join('/');
}

const routes = serverFiles(apiDir).flatMap((file) =>
	exportedMethods(readFileSync(file, 'utf8')).map((method) => `${method} ${routePath(file)}`)
);
const docs = readFileSync('docs/api.md', 'utf8');
const sections = new Map(
	docs
		.split(/^### /m)
		.slice(1)
		.map((section) => {
			const [heading, ...body] = section.split('\n');
			return [heading.trim(), body.join('\n')] as const;
		})
);

describe('the route list', () => {
	it('reads the methods a route module exports, and nothing else', () => {
		const source = `export const GET = async () => {};
export async function POST() {}
export const prerender = false;
const PUT = 1;
export function helper() {}`;
		expect(exportedMethods(source)).toEqual(['GET', 'POST']);
	});

	it('finds the farm API routes', () => {
		expect(routes).toEqual(
			expect.arrayContaining([
				'GET /api/v1/farms',
				'POST /api/v1/farms',
				'PUT /api/v1/farms/[farmId]'
			])
		);
	});
});

describe('docs/api.md', () => {
	it.each(routes)('has a heading for %s', (route) => {
		expect([...sections.keys()]).toContain(route);
	});

	it.each(routes)('shows an example request and answer for %s', (route) => {
		const body = sections.get(route) ?? '';
		expect(body).toMatch(/^Request:\n\n```http\n/m);
		expect(body).toMatch(/^Answer `\d{3}`/m);
		expect(body).toContain(`${route.split(' ')[0]} ${route.split(' ')[1].split('[')[0]}`);
	});

	it('names no route or method that does not exist', () => {
		const known = new Set(routes);
		expect([...sections.keys()].filter((heading) => !known.has(heading))).toEqual([]);
	});
});
