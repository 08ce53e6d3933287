import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { buildOpenApiDocument } from '$lib/server/api/openapi';
import { operationIdOf } from '$lib/server/api/operation-naming';
import { NOT_RECORDED, RECORDED_REQUESTS } from '../../src/cli/api-requests';
import { documentAjv, operationsOf, type Document } from './openapi-checks';

/*
 * Answers a real server gave (tests/api-recordings, written by `npm run api:record` against the demo
 * data) checked against the OpenAPI document as it is built now: the status is one the operation
 * lists, the content type one it describes for that status, and the body fits that schema. A
 * recording whose operation is gone fails; so does a GET operation without a recording.
 */

interface Recording {
	method: string;
	path: string;
	status: number;
	contentType: string;
	body: unknown;
}

const folder = join(process.cwd(), 'tests', 'api-recordings');
const recordings = new Map(
	readdirSync(folder)
		.filter((file) => file.endsWith('.json'))
		.map((file) => [
			file.replace(/\.json$/, ''),
			JSON.parse(readFileSync(join(folder, file), 'utf8')) as Recording
		])
);

const doc = buildOpenApiDocument('http://127.0.0.1:3000') as unknown as Document;
const { validatorAt } = documentAjv(doc);

const templateMatches = (template: string, path: string) =>
	new RegExp(`^${template.replace(/\{\w+\}/g, '[^/]+').replace(/\./g, '\\.')}$`).test(
		path.split('?')[0]
	);

/** What in a recording the document does not describe; `name` is `<operationId>[.<variant>]`. */
function recordingProblems(document: Document, name: string, recording: Recording): string[] {
	const operationId = name.split('.')[0];
	const found = operationsOf(document).find((o) => o.operation.operationId === operationId);
	if (!found) return [`${name}: no operation ${operationId} in the document`];
	const { path, method, operation } = found;
	const problems: string[] = [];
	if (recording.method !== method || !templateMatches(path, recording.path))
		problems.push(`${name}: ${recording.method} ${recording.path} is not ${method} ${path}`);
	const status = String(recording.status);
	const listed = operation.responses[status];
	if (!listed) return [...problems, `${name}: ${method} ${path} does not list ${status}`];
	// A problem status is a $ref to its component; a success is described in place.
	const base = listed.$ref
		? ['components', 'responses', listed.$ref.split('/').pop()!]
		: ['paths', path, method, 'responses', status];
	const response = listed.$ref ? doc.components.responses![base[2]] : listed;
	const mediaType = recording.contentType.split(';')[0].trim();
	if (!response.content?.[mediaType])
		return [...problems, `${name}: ${status} is not described as ${mediaType}`];
	const validate = validatorAt([...base, 'content', mediaType, 'schema']);
	if (!validate(recording.body))
		problems.push(
			...(validate.errors ?? []).map((e) => `${name}: body${e.instancePath} ${e.message}`)
		);
	return problems;
}

const requestNames = RECORDED_REQUESTS.map((r) => {
	const id = operationIdOf(r.method, r.template);
	return r.variant ? `${id}.${r.variant}` : id;
});

describe('recorded answers of a real server fit the document', () => {
	it('holds a recording for each request of the recorder, and no other', () => {
		expect([...recordings.keys()].sort()).toEqual([...requestNames].sort());
	});

	it('records every GET operation but those left out on purpose', () => {
		const gets = operationsOf(doc)
			.filter(({ method }) => method === 'get')
			.map(({ operation }) => operation.operationId!);
		const missing = gets.filter(
			(id) => !(id in NOT_RECORDED) && !requestNames.some((name) => name.split('.')[0] === id)
		);
		expect(missing, 'add a request to src/cli/api-requests.ts and run npm run api:record').toEqual(
			[]
		);
	});

	for (const [name, recording] of recordings)
		it(`${name}: ${recording.method.toUpperCase()} ${recording.path.split('?')[0]} → ${recording.status}`, () => {
			expect(recordingProblems(doc, name, recording)).toEqual([]);
		});
});

describe('the check fails when a recording and the document disagree', () => {
	const recordingOf = (name: string) => structuredClone(recordings.get(name)!);

	it('names a recording whose operation is gone', () => {
		expect(recordingProblems(doc, 'getTeaPots', recordingOf('getHealth'))).toEqual([
			'getTeaPots: no operation getTeaPots in the document'
		]);
		const withoutHealth = structuredClone(doc);
		delete withoutHealth.paths['/api/v1/health'];
		expect(recordingProblems(withoutHealth, 'getHealth', recordingOf('getHealth'))).toEqual([
			'getHealth: no operation getHealth in the document'
		]);
	});

	it('names a status, a content type or a body field the document does not describe', () => {
		const teapot = { ...recordingOf('getHealth'), status: 418 };
		expect(recordingProblems(doc, 'getHealth', teapot)).toEqual([
			'getHealth: get /api/v1/health does not list 418'
		]);
		const asText = { ...recordingOf('getMe'), contentType: 'text/plain' };
		expect(recordingProblems(doc, 'getMe', asText)).toEqual([
			'getMe: 200 is not described as text/plain'
		]);
		const lots = recordingOf('getLots') as Recording & { body: { items: { onHand: unknown }[] } };
		lots.body.items[0].onHand = '12 g';
		expect(recordingProblems(doc, 'getLots', lots)).toEqual([
			'getLots: body/items/0/onHand must be number'
		]);
		const elsewhere = { ...recordingOf('getLotsById'), path: '/api/v1/batches/1' };
		expect(recordingProblems(doc, 'getLotsById', elsewhere)).toEqual([
			'getLotsById: get /api/v1/batches/1 is not get /api/v1/lots/{id}'
		]);
	});

	it('checks a problem answer against the Problem schema', () => {
		const notFound = {
			...recordingOf('getLotsById'),
			status: 404,
			contentType: 'application/problem+json',
			body: { type: 'urn:brothwright:problem:not-found', title: 'Not Found', status: 404 }
		};
		expect(recordingProblems(doc, 'getLotsById', notFound)).toEqual([
			"getLotsById: body must have required property 'detail'"
		]);
	});
});
