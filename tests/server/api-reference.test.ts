import { describe, expect, it, vi } from 'vitest';
import { buildOpenApiDocument } from '$lib/server/api/openapi';
import { accessInWords, apiReference, problemsOf } from '$lib/server/api/reference';
import { rowsUnder, typeInWords, type JsonSchema } from '$lib/server/api/reference-fields';
import { enterEvent } from './endpoint-call';

// The page's guard reads the event through getRequestEvent: see endpoint-call.ts.
vi.mock('$app/server', async (importOriginal) => ({
	...(await importOriginal<typeof import('$app/server')>()),
	getRequestEvent: (await import('./endpoint-call')).currentEvent
}));

const document = buildOpenApiDocument('http://127.0.0.1:3000');
const groups = apiReference(document);
const operation = (id: string) => {
	const found = groups.flatMap((g) => g.operations).find((op) => op.id === id);
	if (!found) throw new Error(`no operation ${id}`);
	return found;
};
const row = <R extends { name: string }>(rows: R[], name: string) =>
	rows.find((r) => r.name === name)!;

describe('the API reference page reads the OpenAPI document', () => {
	it('groups every operation by its tag, in the document’s order', () => {
		expect(groups.map((g) => g.name)).toEqual(document.tags.map((t) => t.name));
		const count = Object.values(document.paths).flatMap((item) => Object.keys(item)).length;
		expect(groups.flatMap((g) => g.operations)).toHaveLength(count);
		expect(groups.find((g) => g.name === 'recipes')!.description).toMatch(/recipes/i);
	});

	it('says who may call each operation, by the role labels, and the scope a token needs', () => {
		expect(operation('postSimulate').who).toBe('Process engineer or Media scientist');
		expect(operation('postSimulate').scope).toBe('simulation.use');
		expect(operation('getMe').who).toBe('Anyone signed in');
		expect(operation('getHealth')).toMatchObject({ who: 'Anyone, signed in or not', scope: null });
		expect(accessInWords(['admin'])).toBe('Administrator');
		expect(accessInWords(['engineer', 'media_scientist', 'inventory_lead'])).toBe(
			'Process engineer, Media scientist or Inventory lead'
		);
	});

	it('lists parameters with where they go, their type, allowed values and default', () => {
		const lots = operation('getLots').parameters;
		expect(row(lots, 'status')).toMatchObject({
			in: 'query',
			required: false,
			type: 'string',
			values: ['quarantine', 'released', 'rejected']
		});
		expect(row(lots, 'limit')).toMatchObject({
			type: 'integer',
			rules: ['≥ 1', '≤ 200', 'default 50']
		});
		expect(row(operation('getLotsById').parameters, 'id')).toMatchObject({
			in: 'path',
			required: true
		});
	});

	it('shows a request body as fields, nested ones a level deeper, with ranges and required ones', () => {
		const fields = operation('postSimulate').request!.fields;
		const kinetics = fields.findIndex((r) => r.name === 'kinetics');
		expect(fields[kinetics]).toMatchObject({ depth: 0, type: 'object', required: true });
		expect(fields[kinetics + 1]).toMatchObject({
			name: 'muMaxPerH',
			depth: 1,
			type: 'number',
			required: true,
			description: '1/h',
			rules: ['> 0', '< 50']
		});
		expect(row(fields, 'mode').values).toEqual([
			'batch',
			'fedBatch',
			'chemostat',
			'perfusion',
			'drawFill'
		]);
		const preview = operation('postRecipesPreview').request!.fields;
		expect(row(preview, 'lines')).toMatchObject({ type: 'object[]', required: true });
		expect(row(preview, 'kind')).toMatchObject({ depth: 1, rules: ['default "component"'] });
	});

	it('names each shape of a union by the field that tells them apart', () => {
		const fields = operation('postStoichiometry').request!.fields;
		expect(row(fields, 'specifications').type).toBe('(one of 3 objects)[]');
		const shapes = fields.filter((r) => r.name.startsWith('when kind is'));
		expect(shapes.map((r) => [r.name, r.depth, r.shape])).toEqual([
			['when kind is "rate"', 1, true],
			['when kind is "massYield"', 1, true],
			['when kind is "molarRatio"', 1, true]
		]);
		expect(row(fields, 'gPerG')).toMatchObject({ depth: 2, required: true });
	});

	it('shows the answer likewise, a 204 as no content, and other media types', () => {
		const analysis = operation('getRunsByIdAnalysis').success;
		expect(analysis.status).toBe('200');
		expect(row(analysis.body!.fields, 'plan').type).toBe('object | null');
		expect(row(analysis.body!.fields, 'chart').type).toBe('map name → object');
		expect(row(analysis.body!.fields, 'chart').values).toContain('do_percent');
		expect(operation('deleteSession').success).toEqual({
			status: '204',
			description: 'Signed out',
			body: null
		});
		expect(operation('getRunsByIdData').success.body!.others).toEqual([
			{ mediaType: 'text/csv', description: expect.stringMatching(/CSV/) }
		]);
		expect(operation('getScenarios').success.body!.type).toBe('object[]');
	});

	it('lists the problems each operation can answer, with their meaning', () => {
		const problems = operation('postScenarios').problems;
		expect(problems.map((p) => p.status)).toEqual([
			'400',
			'401',
			'403',
			'409',
			'413',
			'415',
			'429'
		]);
		expect(problems.find((p) => p.status === '429')!.meaning).toMatch(/Retry-After/);
		const all = problemsOf(document);
		expect(JSON.parse(all.find((p) => p.status === '400')!.example)).toMatchObject({
			status: 400,
			errors: expect.arrayContaining([{ path: 'quantity', message: expect.any(String) }])
		});
	});
});

describe('a JSON Schema read as types and rows', () => {
	it('writes types as a developer would', () => {
		const cases: [JsonSchema, string][] = [
			[{ type: 'integer' }, 'integer'],
			[{ anyOf: [{ type: 'number' }, { type: 'null' }] }, 'number | null'],
			[
				{ type: 'array', items: { anyOf: [{ type: 'number' }, { type: 'null' }] } },
				'(number | null)[]'
			],
			[{ type: 'object', additionalProperties: { type: 'number' } }, 'map string → number'],
			[{ type: 'string', format: 'date-time' }, 'string (date-time)'],
			[
				{ type: 'array', prefixItems: [{ type: 'number' }, { type: 'string' }] },
				'[number, string]'
			],
			[{ const: 'rate' }, '"rate"'],
			[{}, 'any']
		];
		for (const [schema, words] of cases) expect(typeInWords(schema), words).toBe(words);
	});

	it('puts a map’s value fields under it and leaves a list of numbers without rows', () => {
		const map: JsonSchema = {
			type: 'object',
			additionalProperties: {
				type: 'object',
				properties: { gPerL: { type: 'number' } },
				required: ['gPerL']
			}
		};
		expect(rowsUnder(map, 1)).toEqual([
			{
				name: 'gPerL',
				depth: 1,
				type: 'number',
				required: true,
				description: '',
				values: [],
				rules: [],
				shape: false
			}
		]);
		expect(rowsUnder({ type: 'array', items: { type: 'number' } }, 0)).toEqual([]);
	});
});

describe('the page', () => {
	it('opens for anyone, signed in or not, with the groups and the problems', async () => {
		const { load } = await import('../../src/routes/api-reference/+page.server');
		enterEvent(new Request('http://127.0.0.1/api-reference'), { user: null });
		const data = (await load({} as never)) as {
			groups: { name: string }[];
			problems: { status: string }[];
		};
		expect(data.groups.map((g) => g.name)).toContain('runs');
		expect(data.problems.map((p) => p.status)).toEqual(
			expect.arrayContaining(['400', '413', '415', '429'])
		);
	});
});
