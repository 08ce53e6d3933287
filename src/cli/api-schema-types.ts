// The TypeScript types of the API, generated from the OpenAPI document the server serves: written by
// `npm run api:types` to src/lib/api/schema.d.ts, and made again in memory by
// tests/server/api-types.test.ts, which fails when the committed file is out of date.
import openapiTS, { astToString, COMMENT_HEADER, type OpenAPI3 } from 'openapi-typescript';
import { buildOpenApiDocument } from '../lib/server/api/openapi';

export const SCHEMA_TYPES_PATH = 'src/lib/api/schema.d.ts';

const HEADER = `${COMMENT_HEADER.trimEnd()}
// Made by \`npm run api:types\` from the OpenAPI document (buildOpenApiDocument in
// src/lib/server/api/openapi.ts): change the operations, then run it again.

`;

/** The document the types are made from; the origin only fills `servers`, which they do not carry. */
export const typedDocument = () => buildOpenApiDocument('http://127.0.0.1:3000');

/** The text of src/lib/api/schema.d.ts for the document as the operations describe it now. */
export async function schemaTypesText(document: object = typedDocument()): Promise<string> {
	const nodes = await openapiTS(document as OpenAPI3, { silent: true });
	return `${HEADER}${astToString(nodes)}`;
}
