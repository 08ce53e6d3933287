// The parts of the OpenAPI 3.1 specification (spec.openapis.org/oas/v3.1.0) this document uses,
// as a JSON Schema 2020-12: the objects, their required fields and their allowed keys. A key the
// specification does not name (other than `x-…`) is refused, so a misspelt field fails.

const extensions = { '^x-': {} };
const schemaObject = { type: ['object', 'boolean'] };

const mediaType = {
	type: 'object',
	properties: { schema: schemaObject, example: true, examples: { type: 'object' } },
	additionalProperties: false
};

const content = {
	type: 'object',
	minProperties: 1,
	propertyNames: { pattern: '^[a-z]+/[a-z0-9.+-]+$' },
	additionalProperties: mediaType
};

const header = {
	type: 'object',
	required: ['schema'],
	properties: {
		description: { type: 'string' },
		required: { type: 'boolean' },
		schema: schemaObject
	},
	additionalProperties: false
};

const response = {
	type: 'object',
	required: ['description'],
	properties: {
		description: { type: 'string' },
		headers: { type: 'object', additionalProperties: header },
		content
	},
	patternProperties: extensions,
	additionalProperties: false
};

const reference = {
	type: 'object',
	required: ['$ref'],
	properties: {
		$ref: { type: 'string' },
		summary: { type: 'string' },
		description: { type: 'string' }
	},
	additionalProperties: false
};

const parameter = {
	type: 'object',
	required: ['name', 'in', 'schema'],
	properties: {
		name: { type: 'string', minLength: 1 },
		in: { enum: ['query', 'header', 'path', 'cookie'] },
		required: { type: 'boolean' },
		description: { type: 'string' },
		schema: schemaObject
	},
	additionalProperties: false,
	// A path parameter is always required (OpenAPI 3.1, Parameter Object).
	if: { properties: { in: { const: 'path' } } },
	then: { required: ['required'], properties: { required: { const: true } } }
};

const operation = {
	type: 'object',
	required: ['responses'],
	properties: {
		operationId: { type: 'string', pattern: '^[a-z][A-Za-z0-9]*$' },
		tags: { type: 'array', items: { type: 'string' } },
		summary: { type: 'string' },
		description: { type: 'string' },
		parameters: { type: 'array', items: parameter },
		requestBody: {
			type: 'object',
			required: ['content'],
			properties: { description: { type: 'string' }, required: { type: 'boolean' }, content },
			additionalProperties: false
		},
		responses: {
			type: 'object',
			minProperties: 1,
			propertyNames: { pattern: '^([1-5][0-9][0-9]|[1-5]XX|default)$' },
			additionalProperties: { oneOf: [reference, response] }
		},
		security: {
			type: 'array',
			items: { type: 'object', additionalProperties: { type: 'array', items: { type: 'string' } } }
		},
		deprecated: { type: 'boolean' }
	},
	patternProperties: extensions,
	additionalProperties: false
};

const securityScheme = {
	type: 'object',
	required: ['type'],
	properties: {
		type: { enum: ['apiKey', 'http', 'mutualTLS', 'oauth2', 'openIdConnect'] },
		description: { type: 'string' },
		name: { type: 'string' },
		in: { enum: ['query', 'header', 'cookie'] },
		scheme: { type: 'string' },
		bearerFormat: { type: 'string' }
	},
	additionalProperties: false,
	allOf: [
		{
			if: { properties: { type: { const: 'apiKey' } } },
			then: { required: ['name', 'in'] }
		},
		{ if: { properties: { type: { const: 'http' } } }, then: { required: ['scheme'] } }
	]
};

export const openApi31Shape = {
	type: 'object',
	required: ['openapi', 'info', 'paths'],
	properties: {
		openapi: { type: 'string', pattern: '^3\\.1\\.\\d+$' },
		info: {
			type: 'object',
			required: ['title', 'version'],
			properties: {
				title: { type: 'string' },
				version: { type: 'string' },
				description: { type: 'string' }
			},
			additionalProperties: false
		},
		servers: {
			type: 'array',
			items: {
				type: 'object',
				required: ['url'],
				properties: { url: { type: 'string' }, description: { type: 'string' } },
				additionalProperties: false
			}
		},
		tags: {
			type: 'array',
			items: {
				type: 'object',
				required: ['name'],
				properties: { name: { type: 'string' }, description: { type: 'string' } },
				additionalProperties: false
			}
		},
		paths: {
			type: 'object',
			propertyNames: { pattern: '^/' },
			additionalProperties: {
				type: 'object',
				properties: Object.fromEntries(
					['get', 'put', 'post', 'delete', 'patch', 'options', 'head', 'trace'].map((m) => [
						m,
						operation
					])
				),
				additionalProperties: false
			}
		},
		components: {
			type: 'object',
			properties: {
				schemas: { type: 'object', additionalProperties: schemaObject },
				responses: { type: 'object', additionalProperties: response },
				securitySchemes: { type: 'object', additionalProperties: securityScheme }
			},
			additionalProperties: false
		}
	},
	patternProperties: extensions,
	additionalProperties: false
};
