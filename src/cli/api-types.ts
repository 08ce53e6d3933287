// `npm run api:types`: writes src/lib/api/schema.d.ts, the types of every operation, from the
// OpenAPI document; src/lib/api/client.ts is typed with them.
import { writeFileSync } from 'node:fs';
import { SCHEMA_TYPES_PATH, schemaTypesText } from './api-schema-types';

writeFileSync(SCHEMA_TYPES_PATH, await schemaTypesText());
console.log(`Wrote ${SCHEMA_TYPES_PATH}.`);
