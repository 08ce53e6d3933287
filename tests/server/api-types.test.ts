import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { SCHEMA_TYPES_PATH, schemaTypesText, typedDocument } from '../../src/cli/api-schema-types';

/*
 * src/lib/api/schema.d.ts types the app's API client; it is generated from the OpenAPI document, so
 * a change to an operation must come with the file made again.
 */
describe('the committed API types', () => {
	it('are what the document gives now', async () => {
		const committed = readFileSync(SCHEMA_TYPES_PATH, 'utf8');
		const fresh = await schemaTypesText();
		expect(committed === fresh, `${SCHEMA_TYPES_PATH} is out of date: run npm run api:types`).toBe(
			true
		);
	});

	it('change when an operation does', async () => {
		const document = typedDocument() as unknown as {
			paths: Record<string, { get?: { summary: string } }>;
		};
		const committed = readFileSync(SCHEMA_TYPES_PATH, 'utf8');
		expect(committed).toContain('"/api/v1/runs/{id}/analysis"');
		document.paths['/api/v1/health'].get!.summary = 'Answers whether the service is up';
		const changed = await schemaTypesText(document);
		expect(changed).not.toBe(committed);
		expect(changed).toContain('/** Answers whether the service is up */');
	});
});
