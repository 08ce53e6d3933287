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
		const onDisk = endpointFiles(join(apiRoot, 'api', 'v1')).map(toOpenApiPath).sort();
		expect(Object.keys(document.paths).sort()).toEqual(onDisk);
	});

	it('is OpenAPI 3.1 with a problem+json error shape', () => {
		expect(document.openapi).toBe('3.1.0');
		expect(document.components.schemas.Problem.required).toEqual(['type', 'title', 'status', 'detail']);
		const session = document.paths['/api/v1/session'].post as { requestBody: { content: Record<string, { schema: { properties: object } }> } };
		expect(Object.keys(session.requestBody.content['application/json'].schema.properties)).toEqual(['email', 'password']);
	});
});
