// Reads route modules with the TypeScript compiler and says, for each handler, whether its first
// statement calls a guard from the access module. Used by tests/unit/routes/route-guards.test.ts.
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import ts from 'typescript';

export const ACCESS_MODULE_FILE = 'src/lib/server/auth/access.ts';
const ACCESS_MODULE_IMPORT = '$lib/server/auth/access';

/** Exports SvelteKit calls to answer a request; page options (`prerender`, `ssr`…) are not. */
const REQUEST_HANDLERS = new Set([
	'load',
	'GET',
	'POST',
	'PUT',
	'PATCH',
	'DELETE',
	'OPTIONS',
	'HEAD',
	'fallback'
]);

export interface HandlerReport {
	/** `load`, `GET`…, or `actions.<name>` for a form action. */
	name: string;
	line: number;
	/** Why the handler does not count as guarded; absent when its first statement calls a guard. */
	problem?: string;
}

type FunctionNode = ts.FunctionLikeDeclaration;
/** A handler's function, or why its body cannot be read here (which counts as unguarded). */
type Target = FunctionNode | string;
type Report = (name: string, node: ts.Node, target: Target) => void;

const NOT_IN_FILE = 'is not a function written in this file';

/** Every `+page.server.ts`, `+layout.server.ts` and `+server.ts` under a folder. */
export function routeServerFiles(dir: string): string[] {
	return readdirSync(dir, { withFileTypes: true })
		.flatMap((entry) => {
			const path = join(dir, entry.name);
			if (entry.isDirectory()) return routeServerFiles(path);
			return /^\+(page|layout)\.server\.ts$|^\+server\.ts$/.test(entry.name) ? [path] : [];
		})
		.sort();
}

/** Each guard, and whether it returns a promise that the handler must await. */
export type Guards = ReadonlyMap<string, { async: boolean }>;

/** The guards: functions the access module exports whose names start with `require`. */
export function readGuards(file = ACCESS_MODULE_FILE): Guards {
	const source = parse(file, readFileSync(file, 'utf8'));
	const guards = new Map<string, { async: boolean }>();
	const add = (name: string, fn: FunctionNode) => {
		if (name.startsWith('require')) guards.set(name, { async: isAsync(fn) });
	};
	for (const statement of source.statements) {
		if (!isExported(statement)) continue;
		if (ts.isFunctionDeclaration(statement) && statement.name) add(statement.name.text, statement);
		if (ts.isVariableStatement(statement)) {
			for (const declaration of statement.declarationList.declarations) {
				const fn = functionOf(declaration.initializer);
				if (ts.isIdentifier(declaration.name) && fn) add(declaration.name.text, fn);
			}
		}
	}
	return guards;
}

/** One report per request handler and form action the module exports. */
export function checkRouteModule(fileName: string, text: string, guards: Guards): HandlerReport[] {
	const source = parse(fileName, text);
	const module = new RouteModule(source, guards);
	const reports: HandlerReport[] = [];
	const report: Report = (name, node, target) => {
		const line = source.getLineAndCharacterOfPosition(node.getStart(source)).line + 1;
		const problem = typeof target === 'string' ? target : module.problemWith(target);
		reports.push(problem ? { name, line, problem } : { name, line });
	};
	const exported = (name: string, node: ts.Node, value: ts.Expression | undefined) => {
		if (name === 'actions') {
			const actions = unwrap(value);
			if (actions && ts.isObjectLiteralExpression(actions)) {
				module.actions(actions, report);
			} else {
				report('actions', node, 'is not an object literal, so its actions cannot be read');
			}
		} else if (REQUEST_HANDLERS.has(name)) {
			report(name, node, module.resolve(value) ?? NOT_IN_FILE);
		}
	};

	for (const statement of source.statements) {
		if (ts.isFunctionDeclaration(statement) && isExported(statement) && statement.name) {
			if (REQUEST_HANDLERS.has(statement.name.text)) {
				report(statement.name.text, statement, statement);
			}
		} else if (ts.isVariableStatement(statement) && isExported(statement)) {
			for (const declaration of statement.declarationList.declarations) {
				if (ts.isIdentifier(declaration.name)) {
					exported(declaration.name.text, declaration, declaration.initializer);
				}
			}
		} else if (ts.isExportDeclaration(statement) && statement.exportClause) {
			if (!ts.isNamedExports(statement.exportClause) || statement.isTypeOnly) continue;
			for (const specifier of statement.exportClause.elements) {
				const local = specifier.propertyName ?? specifier.name;
				// `export { load } from './elsewhere'`: the body is not in this file.
				const value = statement.moduleSpecifier ? undefined : local;
				exported(specifier.name.text, specifier, value);
			}
		}
	}
	return reports;
}

class RouteModule {
	/** Local names that refer to guards: `requireUser`, an alias of it, or `access.requireUser`. */
	private guardAliases = new Map<string, string>();
	private guardNamespaces = new Set<string>();
	/** Functions declared at the top of the file, by name, so an action may refer to one. */
	private functions = new Map<string, FunctionNode>();

	constructor(
		source: ts.SourceFile,
		private guards: Guards
	) {
		for (const statement of source.statements) {
			if (ts.isImportDeclaration(statement)) this.readImport(statement);
			if (ts.isFunctionDeclaration(statement) && statement.name && statement.body) {
				this.functions.set(statement.name.text, statement);
			}
			if (ts.isVariableStatement(statement)) {
				for (const declaration of statement.declarationList.declarations) {
					const fn = functionOf(declaration.initializer);
					if (ts.isIdentifier(declaration.name) && fn) {
						this.functions.set(declaration.name.text, fn);
					}
				}
			}
		}
	}

	private readImport(statement: ts.ImportDeclaration) {
		const from = (statement.moduleSpecifier as ts.StringLiteral).text;
		const bindings = statement.importClause?.namedBindings;
		if (from !== ACCESS_MODULE_IMPORT || !bindings) return;
		if (ts.isNamespaceImport(bindings)) {
			this.guardNamespaces.add(bindings.name.text);
			return;
		}
		for (const element of bindings.elements) {
			const imported = (element.propertyName ?? element.name).text;
			if (this.guards.has(imported)) this.guardAliases.set(element.name.text, imported);
		}
	}

	/** The function an exported value or action refers to, when its body is in this file. */
	resolve(value: ts.Expression | undefined): FunctionNode | undefined {
		const node = unwrap(value);
		if (!node) return undefined;
		if (ts.isIdentifier(node)) return this.functions.get(node.text);
		return functionOf(node);
	}

	actions(actions: ts.ObjectLiteralExpression, report: Report) {
		for (const property of actions.properties) {
			const name = property.name ? `actions.${propertyName(property.name)}` : 'actions.(spread)';
			if (ts.isMethodDeclaration(property)) {
				report(name, property, property);
			} else if (ts.isPropertyAssignment(property)) {
				report(name, property, this.resolve(property.initializer) ?? NOT_IN_FILE);
			} else if (ts.isShorthandPropertyAssignment(property)) {
				report(name, property, this.resolve(property.name) ?? NOT_IN_FILE);
			} else {
				report(name, property, 'cannot be read (spread or accessor)');
			}
		}
	}

	/** Why a handler's first statement is not a guard call, or undefined when it is. */
	problemWith(fn: FunctionNode): string | undefined {
		if (!fn.body) return 'has no body';
		if (!ts.isBlock(fn.body)) {
			return 'has an expression body, so no statement can call a guard first';
		}
		const [first] = fn.body.statements;
		if (!first) return 'is empty';
		const call = this.guardCall(first);
		if (!call) return `does not call ${[...this.guards.keys()].join(', ')} in its first statement`;
		if (call.async && !call.awaited) {
			return `calls ${call.guard} without await, so it runs on before the check ends`;
		}
		return undefined;
	}

	/** The guard a statement calls: `guard(…)`, `await guard(…)`, `const x = [await] guard(…)`. */
	private guardCall(statement: ts.Statement) {
		let expression: ts.Expression | undefined;
		if (ts.isExpressionStatement(statement)) expression = statement.expression;
		if (ts.isVariableStatement(statement)) {
			expression = statement.declarationList.declarations[0]?.initializer;
		}
		while (expression && ts.isParenthesizedExpression(expression)) {
			expression = expression.expression;
		}
		const awaited = !!expression && ts.isAwaitExpression(expression);
		const call = unwrap(expression);
		if (!call || !ts.isCallExpression(call)) return undefined;
		const guard = this.guardCalled(call.expression);
		return guard ? { guard, awaited, async: this.guards.get(guard)?.async } : undefined;
	}

	private guardCalled(callee: ts.Expression): string | undefined {
		if (ts.isIdentifier(callee)) return this.guardAliases.get(callee.text);
		const viaNamespace =
			ts.isPropertyAccessExpression(callee) &&
			ts.isIdentifier(callee.expression) &&
			this.guardNamespaces.has(callee.expression.text) &&
			this.guards.has(callee.name.text);
		return viaNamespace ? callee.name.text : undefined;
	}
}

function parse(fileName: string, text: string): ts.SourceFile {
	return ts.createSourceFile(fileName, text, ts.ScriptTarget.Latest, true, ts.ScriptKind.TS);
}

function isExported(node: ts.Node): boolean {
	return (
		ts.canHaveModifiers(node) &&
		(ts.getModifiers(node) ?? []).some((m) => m.kind === ts.SyntaxKind.ExportKeyword)
	);
}

/** The expression under `( … )`, `await`, `satisfies T`, `as T` and `!`. */
function unwrap(node: ts.Expression | undefined): ts.Expression | undefined {
	while (
		node &&
		(ts.isParenthesizedExpression(node) ||
			ts.isAwaitExpression(node) ||
			ts.isSatisfiesExpression(node) ||
			ts.isAsExpression(node) ||
			ts.isNonNullExpression(node))
	) {
		node = node.expression;
	}
	return node;
}

function isAsync(fn: FunctionNode): boolean {
	const returnsPromise =
		!!fn.type && ts.isTypeReferenceNode(fn.type) && fn.type.typeName.getText() === 'Promise';
	return (
		returnsPromise || (ts.getModifiers(fn) ?? []).some((m) => m.kind === ts.SyntaxKind.AsyncKeyword)
	);
}

function functionOf(node: ts.Expression | undefined): FunctionNode | undefined {
	const inner = unwrap(node);
	return inner && (ts.isArrowFunction(inner) || ts.isFunctionExpression(inner)) ? inner : undefined;
}

function propertyName(name: ts.PropertyName): string {
	return ts.isIdentifier(name) || ts.isStringLiteral(name) || ts.isNumericLiteral(name)
		? name.text
		: name.getText();
}
