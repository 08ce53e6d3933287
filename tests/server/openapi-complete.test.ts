import { beforeAll, describe, expect, it } from 'vitest';
import { buildOpenApiDocument } from '$lib/server/api/openapi';
import {
	documentAjv,
	METHODS,
	operationsOf,
	structuralProblems,
	type Document
} from './openapi-checks';

/*
 * The OpenAPI document is complete: every endpoint of the route tree is in it and nothing else;
 * every answer, body and problem it lists is described; its names are there for generated clients;
 * and it is OpenAPI 3.1 whose every schema is JSON Schema 2020-12. Each check returns what it finds,
 * and a broken copy of the document shows that it finds it.
 */

type Route = Record<string, unknown>;
const routeModules = import.meta.glob<Route>('../../src/routes/api/v1/**/+server.ts');

/** `../../src/routes/api/v1/recipes/[id]/+server.ts` → `/api/v1/recipes/{id}`. */
const openApiPathOf = (file: string) =>
	file
		.replace(/^\.\.\/\.\.\/src\/routes/, '')
		.replace(/\/\+server\.ts$/, '')
		.replace(/\[(\w+)\]/g, '{$1}');

/** Each endpoint's path and the methods its file exports. */
let routes: Map<string, Set<string>>;

beforeAll(async () => {
	routes = new Map();
	for (const [file, load] of Object.entries(routeModules)) {
		const module = await load();
		const methods = METHODS.filter((m) => typeof module[m.toUpperCase()] === 'function');
		routes.set(openApiPathOf(file), new Set(methods));
	}
});

const documentNow = () => buildOpenApiDocument('http://127.0.0.1:3000') as unknown as Document;
const copyOf = (doc: Document): Document => structuredClone(doc);

function routeProblems(doc: Document, onDisk: Map<string, Set<string>>): string[] {
	const problems: string[] = [];
	for (const [path, methods] of onDisk)
		for (const method of methods)
			if (!doc.paths[path]?.[method]) problems.push(`${method} ${path}: no operation`);
	for (const { path, method } of operationsOf(doc))
		if (!onDisk.get(path)?.has(method)) problems.push(`${method} ${path}: no route`);
	return problems;
}

const WRITES = new Set(['post', 'put', 'patch']);

function answerProblems(doc: Document): string[] {
	const problems: string[] = [];
	for (const { path, method, operation } of operationsOf(doc)) {
		const name = `${method} ${path}`;
		// An act that needs a signature never succeeds here: it answers 403 with the page to sign on.
		if (operation['x-signature-required']) continue;
		const successes = Object.entries(operation.responses).filter(([s]) => /^2/.test(s));
		if (successes.length !== 1) problems.push(`${name}: ${successes.length} success answers`);
		for (const [status, response] of successes) {
			const schemas = Object.values(response.content ?? {}).filter((m) => m.schema);
			if (status === '204' && response.content) problems.push(`${name}: a 204 with content`);
			if (status !== '204' && schemas.length === 0)
				problems.push(`${name}: ${status} has no response schema`);
		}
		const body = operation.requestBody?.content?.['application/json']?.schema;
		if (WRITES.has(method) && !body && !operation['x-no-body'])
			problems.push(`${name}: a write without a request schema`);
		const listed = Object.keys(operation.responses);
		const needed = ['429', ...(operation.requestBody ? ['413', '415'] : [])];
		for (const status of needed)
			if (!listed.includes(status)) problems.push(`${name}: does not list ${status}`);
	}
	return problems;
}

/** Every 4xx or 5xx an operation lists is a problem component with an example of its status. */
function problemListProblems(doc: Document): string[] {
	const problems: string[] = [];
	const { validatorAt } = documentAjv(doc);
	const checked = new Set<string>();
	for (const { path, method, operation } of operationsOf(doc))
		for (const [status, response] of Object.entries(operation.responses)) {
			if (!/^[45]/.test(status)) continue;
			const name = `${method} ${path} ${status}`;
			const component = `Problem${status}`;
			if (response.$ref !== `#/components/responses/${component}`) {
				problems.push(`${name}: not a $ref to ${component}`);
				continue;
			}
			if (checked.has(component)) continue;
			checked.add(component);
			const media = doc.components.responses?.[component]?.content?.['application/problem+json'];
			if (!media) {
				problems.push(`${component}: missing, or not application/problem+json`);
				continue;
			}
			// One example, or several named ones (403: a missing role, a signature required).
			const example = (media.example ?? media.examples?.usual?.value) as
				{ status?: number; detail?: string } | undefined;
			if (!example) problems.push(`${component}: no example`);
			else {
				const validate = validatorAt(['components', 'schemas', 'Problem']);
				if (!validate(example)) problems.push(`${component}: ${JSON.stringify(validate.errors)}`);
				if (example.status !== Number(status))
					problems.push(`${component}: its example has status ${example.status}`);
			}
		}
	const tooMany = doc.components.responses?.Problem429;
	if (!tooMany?.headers?.['Retry-After']) problems.push('Problem429: Retry-After not described');
	return problems;
}

function namingProblems(doc: Document): string[] {
	const problems: string[] = [];
	const seen = new Map<string, string>();
	const tags = new Set((doc.tags ?? []).map((t) => t.name));
	for (const { path, method, operation } of operationsOf(doc)) {
		const name = `${method} ${path}`;
		const id = operation.operationId;
		if (!id) problems.push(`${name}: no operationId`);
		else if (seen.has(id)) problems.push(`${name}: operationId ${id} is also ${seen.get(id)}'s`);
		else seen.set(id, name);
		if (operation.tags?.length !== 1) problems.push(`${name}: ${operation.tags?.length} tags`);
		for (const tag of operation.tags ?? [])
			if (!tags.has(tag)) problems.push(`${name}: tag ${tag} is not in the document's tags`);
		for (const [, parameter] of path.matchAll(/\{(\w+)\}/g))
			if (!operation.parameters?.some((p) => p.in === 'path' && p.name === parameter))
				problems.push(`${name}: path parameter ${parameter} not described`);
	}
	return problems;
}

describe('the OpenAPI document is complete', () => {
	it('has an operation for each method every route file under /api/v1 exports, and a route for each operation', () => {
		expect(routes.size).toBeGreaterThan(20);
		const doc = documentNow();
		expect(routeProblems(doc, routes)).toEqual([]);
		const broken = copyOf(doc);
		delete broken.paths['/api/v1/health'].get;
		broken.paths['/api/v1/formula'].put = broken.paths['/api/v1/formula'].post;
		expect(routeProblems(broken, routes)).toEqual([
			'get /api/v1/health: no operation',
			'put /api/v1/formula: no route'
		]);
	});

	it('describes every answer but a 204, every write’s body, and the 429, 413 and 415 that apply', () => {
		const doc = documentNow();
		expect(answerProblems(doc)).toEqual([]);
		const broken = copyOf(doc);
		delete broken.paths['/api/v1/me'].get.responses['200'].content;
		delete broken.paths['/api/v1/formula'].post.requestBody;
		delete broken.paths['/api/v1/simulate'].post.responses['415'];
		broken.paths['/api/v1/session'].delete.responses['204'].content = {
			'application/json': { schema: {} }
		};
		expect(answerProblems(broken)).toEqual([
			'get /api/v1/me: 200 has no response schema',
			'delete /api/v1/session: a 204 with content',
			'post /api/v1/formula: a write without a request schema',
			'post /api/v1/simulate: does not list 415'
		]);
	});

	it('gives each operation a 204 without content where it answers none', () => {
		const doc = documentNow();
		const noContent = operationsOf(doc).filter(({ operation }) => operation.responses['204']);
		expect(noContent.map(({ method, path }) => `${method} ${path}`)).toEqual(
			expect.arrayContaining(['delete /api/v1/session', 'delete /api/v1/scenarios/{id}'])
		);
	});

	it('lists every 4xx and 5xx as a problem component with an example body of its status', () => {
		const doc = documentNow();
		expect(problemListProblems(doc)).toEqual([]);
		const broken = copyOf(doc);
		const media = (name: string) =>
			broken.components.responses![name].content!['application/problem+json'];
		delete media('Problem404').example;
		(media('Problem409').example as { status: number }).status = 400;
		delete (media('Problem400').example as { title?: string }).title;
		delete broken.components.responses!.Problem429.headers;
		expect(problemListProblems(broken)).toEqual(
			expect.arrayContaining([
				'Problem404: no example',
				'Problem409: its example has status 400',
				expect.stringMatching(/^Problem400: .*title/),
				'Problem429: Retry-After not described'
			])
		);
	});

	it('names each operation once, tags it with its group and describes its path parameters', () => {
		const doc = documentNow();
		expect(namingProblems(doc)).toEqual([]);
		const recipe = doc.paths['/api/v1/recipes/{id}/versions/{n}'].get;
		expect(recipe.operationId).toBe('getRecipesByIdVersionsByN');
		expect(recipe.tags).toEqual(['recipes']);
		expect(doc.paths['/api/v1/chemostat/steady-state'].post.operationId).toBe(
			'postChemostatSteadyState'
		);
		const broken = copyOf(doc);
		broken.paths['/api/v1/me'].get.operationId = 'getHealth';
		broken.paths['/api/v1/lots'].get.tags = ['stock'];
		broken.paths['/api/v1/lots/{id}'].get.parameters = [];
		expect(namingProblems(broken)).toEqual([
			"get /api/v1/me: operationId getHealth is also get /api/v1/health's",
			"get /api/v1/lots: tag stock is not in the document's tags",
			'get /api/v1/lots/{id}: path parameter id not described'
		]);
	});

	it('is OpenAPI 3.1 whose every schema compiles as JSON Schema 2020-12', () => {
		const doc = documentNow();
		expect(structuralProblems(doc)).toEqual([]);
		const broken = copyOf(doc);
		broken.openapi = '3.0.3';
		broken.paths['/api/v1/health'].get.responses['200'].content!['application/json'].schema = {
			type: 'thing'
		};
		broken.paths['/api/v1/me'].get.responses['401'] = { $ref: '#/components/responses/Nope' };
		(broken.paths['/api/v1/me'].get as unknown as Record<string, unknown>).summery = 'typo';
		const problems = structuralProblems(broken);
		expect(problems).toEqual(
			expect.arrayContaining([
				expect.stringMatching(/^document\/openapi: must match pattern/),
				expect.stringMatching(/^document\/paths\/~1api~1v1~1me\/get: must NOT have additional/),
				'broken $ref at #/paths/~1api~1v1~1me/get/responses/401: #/components/responses/Nope',
				expect.stringMatching(/~1api~1v1~1health\/get\/responses\/200.*not a JSON Schema 2020-12/)
			])
		);
	});
});
