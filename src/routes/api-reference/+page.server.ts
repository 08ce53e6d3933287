import { buildOpenApiDocument } from '$lib/server/api/openapi';
import { apiReference, problemsOf } from '$lib/server/api/reference';
import { config } from '$lib/server/config';
import { requirePermission } from '$lib/server/guard';
import type { PageServerLoad } from './$types';

// A page to read and print: no script, so nothing but the reference itself is sent.
export const csr = false;

/** Public, like the OpenAPI document it reads: anyone may learn how to call the API. */
export const load: PageServerLoad = () => {
	requirePermission('service.describe');
	const document = buildOpenApiDocument(config.origin);
	return { groups: apiReference(document), problems: problemsOf(document) };
};
