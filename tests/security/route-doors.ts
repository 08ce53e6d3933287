import { readdirSync, readFileSync } from 'node:fs';
import { join, relative, sep } from 'node:path';
import ts from 'typescript';

/*
 * The doors of the route tree, read from src/routes as files (not imported, so this runs outside
 * Vite): every form action of a +page.server.ts, every POST/PUT/PATCH of a +server.ts, and every
 * page whose address holds no parameter.
 */
export const ROUTES_ROOT = join(process.cwd(), 'src', 'routes');

export const BODY_METHODS = ['POST', 'PUT', 'PATCH'] as const;
export type BodyMethod = (typeof BODY_METHODS)[number];

export type Door = {
	/** The file and the action or method, as a developer would look for it. */
	name: string;
	method: BodyMethod;
	/** Address with placeholders in place of parameters, and `?/name` for a named action. */
	url: string;
	isAction: boolean;
};

/*
 * Parameters name no demo record: the body check answers before any route code reads a parameter,
 * and should a body ever slip past it, a door acting on a record would find none to change.
 */
const NO_SUCH_RECORD = '00000000-0000-4000-8000-000000000000';
const PLACEHOLDER_BY_PARAM: Record<string, string> = { n: '1', token: 'no-such-token' };

function routeFiles(dir: string, names: readonly string[]): string[] {
	return readdirSync(dir, { withFileTypes: true }).flatMap((entry) => {
		const full = join(dir, entry.name);
		if (entry.isDirectory()) return routeFiles(full, names);
		return names.includes(entry.name) ? [full] : [];
	});
}

/** The address of a route file's folder: groups `(x)` drop out, parameters get a placeholder. */
export function addressOf(file: string): string {
	const segments = relative(ROUTES_ROOT, file)
		.split(sep)
		.slice(0, -1)
		.filter((segment) => !/^\(.*\)$/.test(segment))
		.map((segment) =>
			segment.replace(
				/\[{1,2}(?:\.\.\.)?(\w+)(?:=\w+)?\]{1,2}/g,
				(_, name: string) => PLACEHOLDER_BY_PARAM[name] ?? NO_SUCH_RECORD
			)
		);
	return `/${segments.join('/')}`;
}

function hasExportModifier(node: ts.Node): boolean {
	return (
		ts.canHaveModifiers(node) &&
		(ts.getModifiers(node) ?? []).some((m) => m.kind === ts.SyntaxKind.ExportKeyword)
	);
}

function unwrap(expression: ts.Expression): ts.Expression {
	let inner = expression;
	while (
		ts.isSatisfiesExpression(inner) ||
		ts.isAsExpression(inner) ||
		ts.isParenthesizedExpression(inner)
	)
		inner = inner.expression;
	return inner;
}

/** The keys of `export const actions = {...}`; a key this cannot name fails, so no door is missed. */
function actionNames(declaration: ts.VariableDeclaration, where: string): string[] {
	const value = declaration.initializer && unwrap(declaration.initializer);
	if (!value || !ts.isObjectLiteralExpression(value))
		throw new Error(`${where}: actions is not an object literal; the sweep cannot list its doors`);
	return value.properties.map((property) => {
		const name = property.name;
		if (name && (ts.isIdentifier(name) || ts.isStringLiteral(name))) return name.text;
		throw new Error(`${where}: an action without a plain name; the sweep cannot list it`);
	});
}

type Exports = { actions: string[]; methods: BodyMethod[] };

function exportsOf(file: string): Exports {
	const where = relative(ROUTES_ROOT, file);
	const source = ts.createSourceFile(file, readFileSync(file, 'utf8'), ts.ScriptTarget.Latest);
	const found: Exports = { actions: [], methods: [] };
	const noteMethod = (name: string) => {
		const method = BODY_METHODS.find((m) => m === name);
		if (method) found.methods.push(method);
	};
	for (const statement of source.statements) {
		if (ts.isVariableStatement(statement) && hasExportModifier(statement)) {
			for (const declaration of statement.declarationList.declarations) {
				if (!ts.isIdentifier(declaration.name)) continue;
				if (declaration.name.text === 'actions')
					found.actions.push(...actionNames(declaration, where));
				noteMethod(declaration.name.text);
			}
		} else if (ts.isFunctionDeclaration(statement) && hasExportModifier(statement)) {
			if (statement.name) noteMethod(statement.name.text);
		} else if (ts.isExportDeclaration(statement) && statement.exportClause) {
			if (ts.isNamedExports(statement.exportClause))
				statement.exportClause.elements.forEach((element) => noteMethod(element.name.text));
		}
	}
	return found;
}

/** Every door that takes a request body. */
export function bodyDoors(): Door[] {
	return routeFiles(ROUTES_ROOT, ['+page.server.ts', '+server.ts']).flatMap((file) => {
		const where = relative(ROUTES_ROOT, file);
		const address = addressOf(file);
		const { actions, methods } = exportsOf(file);
		const actionDoors = actions.map((action) => ({
			name: `${where} ${action === 'default' ? 'default action' : `?/${action}`}`,
			method: 'POST' as const,
			url: action === 'default' ? address : `${address}?/${action}`,
			isAction: true
		}));
		const endpointDoors = methods.map((method) => ({
			name: `${where} ${method}`,
			method,
			url: address,
			isAction: false
		}));
		return [...actionDoors, ...endpointDoors];
	});
}

/** The addresses of pages with no parameter in them: the lists and the blank forms. */
export function pagesWithoutParams(): string[] {
	return routeFiles(ROUTES_ROOT, ['+page.svelte'])
		.filter((file) => !relative(ROUTES_ROOT, file).includes('['))
		.map(addressOf);
}
