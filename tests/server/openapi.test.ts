import { readdirSync } from 'node:fs';
import { join, relative, sep } from 'node:path';
import { describe, expect, it } from 'vitest';
import { buildOpenApiDocument } from '$lib/server/api/openapi';

const apiRoot = join(process.cwd(), 'src', 'routes');

function endpointFiles(dir: string): string[] {
	return readdirSync(dir, { withFileTypes: true }).flatMap((entry) => {
		const full = join(dir, entry.name);
		if (entry.isDirectory()) return endpointFiles(full);
		return entry.name === '+server.ts' ? [full] : [];
	});
}

function toOpenApiPath(file: string): string {
	const route = relative(apiRoot, file).split(sep).slice(0, -1).join('/');
	return `/${route.replace(/\[(\w+)\]/g, '{$1}')}`;
}

describe('openapi.json stays true to the endpoints', () => {
	const document = buildOpenApiDocument('http://127.0.0.1:3000');

	it('describes every endpoint under /api/v1, and nothing that is not there', () => {
		const onDisk = endpointFiles(join(apiRoot, 'api', 'v1'))
			.map(toOpenApiPath)
			.sort();
		expect(Object.keys(document.paths).sort()).toEqual(onDisk);
	});

	it('is OpenAPI 3.1 with a problem+json error shape', () => {
		expect(document.openapi).toBe('3.1.0');
		expect(document.components.schemas.Problem.required).toEqual([
			'type',
			'title',
			'status',
			'detail'
		]);
		const session = document.paths['/api/v1/session'].post as {
			requestBody: { content: Record<string, { schema: { properties: object } }> };
		};
		expect(Object.keys(session.requestBody.content['application/json'].schema.properties)).toEqual([
			'email',
			'password'
		]);
	});
});

describe('the error responses it documents', () => {
	it('lists 404 for a path with an id, and the 409 and 422 an operation can answer', () => {
		const doc = buildOpenApiDocument('http://localhost') as {
			paths: Record<string, Record<string, { responses: Record<string, unknown> }>>;
		};
		const codes = (path: string, method: string) => Object.keys(doc.paths[path][method].responses);
		expect(codes('/api/v1/lots/{id}', 'get')).toContain('404');
		expect(codes('/api/v1/simulate', 'post')).toEqual(
			expect.arrayContaining(['200', '400', '401', '422'])
		);
		expect(codes('/api/v1/studies/evaluate', 'post')).toEqual(
			expect.arrayContaining(['400', '401', '403', '404', '422'])
		);
		expect(codes('/api/v1/scenarios', 'post')).toContain('409');
		expect(codes('/api/v1/health', 'get')).not.toContain('404');
		const doc2 = doc as unknown as { components: { responses: Record<string, unknown> } };
		for (const status of ['404', '409', '422'])
			expect(doc2.components.responses[`Problem${status}`]).toBeDefined();
	});
});

describe('the oxygen saturation operation', () => {
	it('names the O2 fraction o2MoleFraction both ways and states the air default, 0.20946', () => {
		const doc = buildOpenApiDocument('http://localhost') as unknown as {
			paths: Record<
				string,
				{
					post: {
						summary: string;
						requestBody: { content: Record<string, { schema: { properties: object } }> };
						responses: Record<
							string,
							{ content?: Record<string, { schema: { properties: object } }> }
						>;
					};
				}
			>;
		};
		const operation = doc.paths['/api/v1/oxygen/saturation'].post;
		expect(
			Object.keys(operation.requestBody.content['application/json'].schema.properties)
		).toContain('o2MoleFraction');
		expect(
			Object.keys(operation.requestBody.content['application/json'].schema.properties)
		).not.toContain('oxygenMoleFraction');
		expect(
			Object.keys(operation.responses['200'].content!['application/json'].schema.properties)
		).toContain('o2MoleFraction');
		// Dry air, 20.946 % O2 by volume (composition of dry air; from memory).
		expect(operation.summary).toContain('0.20946');
		expect(operation.summary).not.toMatch(/0\.2095(?!\d)/);
	});
});

describe('the growth fit’s documented response', () => {
	it('carries the whole-curve intervals, the poorly-determined flag and the warnings', () => {
		type Schema = { properties: Record<string, Schema>; anyOf?: Schema[]; required?: string[] };
		const doc = buildOpenApiDocument('http://localhost') as unknown as {
			paths: Record<
				string,
				{ post: { responses: { '200': { content: Record<string, { schema: Schema }> } } } }
			>;
		};
		const schema =
			doc.paths['/api/v1/fit/growth'].post.responses['200'].content['application/json'].schema;
		expect(schema.required).toEqual(
			expect.arrayContaining(['exponentialPhase', 'monodFit', 'warnings'])
		);
		const monod = schema.properties.monodFit.anyOf!.find((s) => s.properties)!;
		const ks = monod.properties.estimates.properties.ksGPerL;
		expect(Object.keys(ks.properties)).toEqual([
			'value',
			'standardError',
			'lower95',
			'upper95',
			'poorlyDetermined'
		]);
		expect(Object.keys(schema.properties.exponentialPhase.properties)).toEqual(
			expect.arrayContaining([
				'muMaxPerH',
				'doublingTimeH',
				'longestStraightPointCount',
				'noiseSdLn'
			])
		);
	});
});

describe('the sufficiency and study-evaluation operations', () => {
	type Schema = { properties?: Record<string, Schema>; items?: Schema; description?: string };
	const responseOf = (path: string) => {
		const doc = buildOpenApiDocument('http://localhost') as unknown as {
			paths: Record<
				string,
				{ post: { responses: Record<string, { content?: Record<string, { schema: Schema }> }> } }
			>;
		};
		return doc.paths[path].post.responses['200'].content!['application/json'].schema;
	};

	it('describe the role, confidence and source of each line, and the warnings', () => {
		const sufficiency = responseOf('/api/v1/sufficiency');
		const line = sufficiency.properties!.lines.items!.properties!;
		for (const key of ['role', 'roleFrom', 'confidence', 'source'])
			expect(line[key]?.description, key).toBeTruthy();
		expect(sufficiency.properties!.warnings.description).toMatch(/Trace elements/);
		const evaluate = responseOf('/api/v1/studies/evaluate');
		const nutrientLine = evaluate.properties!.nutrients.properties!.lines.items!.properties!;
		for (const key of ['role', 'confidence', 'source', 'runout'])
			expect(Object.keys(nutrientLine)).toContain(key);
		expect(evaluate.properties!.warnings.description).toMatch(/trace elements/);
	});
});

describe('the simulate operation’s documented request', () => {
	it('is generated from the library’s schema, ranges included', async () => {
		const { MAX_END_H, MAX_FEED_STREAMS } = await import('$chemistry');
		type Schema = { properties: Record<string, Schema & Record<string, unknown>> } & Record<
			string,
			unknown
		>;
		const doc = buildOpenApiDocument('http://localhost') as unknown as {
			paths: Record<
				string,
				{ post: { requestBody: { content: Record<string, { schema: Schema }> } } }
			>;
		};
		const request =
			doc.paths['/api/v1/simulate'].post.requestBody.content['application/json'].schema;
		expect(request.properties.kinetics.properties.muMaxPerH).toMatchObject({
			exclusiveMinimum: 0,
			exclusiveMaximum: 50
		});
		expect(request.properties.endH).toMatchObject({ exclusiveMinimum: 0, maximum: MAX_END_H });
		expect(request.properties.feeds).toMatchObject({ minItems: 1, maxItems: MAX_FEED_STREAMS });
	});
});

describe('the paged lists’ documented query', () => {
	it('names after, limit, sort and dir from the schema the endpoints read them with', () => {
		const doc = buildOpenApiDocument('http://127.0.0.1');
		type Parameter = { name: string; in: string; schema: Record<string, unknown> };
		type Schema = { properties: Record<string, unknown> };
		for (const [path, sorts, filters] of [
			[
				'/api/v1/lots',
				['code', 'component', 'supplier', 'status', 'onHand', 'expiresOn', 'receivedOn'],
				['component', 'status', 'expiringBefore', 'q']
			],
			[
				'/api/v1/batches',
				['number', 'state', 'recipe', 'volume', 'plannedOn', 'intendedUse'],
				['state', 'recipe', 'from', 'to', 'q']
			],
			['/api/v1/components', ['name', 'formula', 'category', 'casNumber'], ['category', 'q']],
			['/api/v1/recipes', ['name'], ['kind', 'status', 'component', 'q']],
			['/api/v1/studies', ['name', 'organism', 'vessel', 'updatedAt'], ['q']],
			['/api/v1/runs', ['number', 'name', 'startedAt', 'vessel'], ['q']]
		] as const) {
			const operation = doc.paths[path].get as {
				parameters: Parameter[];
				responses: Record<string, { content: Record<string, { schema: Schema }> }>;
			};
			const byName = new Map(operation.parameters.map((p) => [p.name, p]));
			expect(byName.get('after'), path).toMatchObject({ in: 'query', schema: { type: 'string' } });
			expect(byName.has('page'), path).toBe(false);
			expect(byName.get('limit')).toMatchObject({ schema: { maximum: 200, default: 50 } });
			expect(byName.get('sort')?.schema.enum).toEqual(sorts);
			expect(byName.get('dir')?.schema.enum).toEqual(['asc', 'desc']);
			for (const name of ['after', 'limit', 'sort', 'dir', ...filters])
				expect(byName.get(name)?.schema.description, `${path} ${name}`).toBeTruthy();
			expect(Object.keys(operation.responses)).toContain('400');
			const answer = operation.responses['200'].content['application/json'].schema;
			expect(Object.keys(answer.properties), path).toEqual(['items', 'total', 'limit', 'next']);
		}
	});
});
