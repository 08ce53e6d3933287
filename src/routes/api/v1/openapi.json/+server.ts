import { endpoint } from '$lib/server/api/endpoint';
import { buildOpenApiDocument } from '$lib/server/api/openapi';
import { config } from '$lib/server/config';

export const GET = endpoint({ act: 'service.describe' }, () => buildOpenApiDocument(config.origin));
