// Checks of the OpenAPI document shared by openapi-complete.test.ts and api-recordings.test.ts:
// each returns the problems it finds, so a test can show that a broken document fails them.
import { Ajv2020, type ValidateFunction } from 'ajv/dist/2020';
import addFormats from 'ajv-formats';
import { openApi31Shape } from './openapi-shape';

export type Schema = Record<string, unknown> | boolean;
export interface MediaType {
	schema?: Schema;
	example?: unknown;
	examples?: Record<string, { summary?: string; value: unknown }>;
}
export interface Response {
	$ref?: string;
	description?: string;
	headers?: Record<string, { schema?: Schema }>;
	content?: Record<string, MediaType>;
}
export interface Operation {
	operationId?: string;
	tags?: string[];
	parameters?: { name: string; in: string; schema?: Schema }[];
	requestBody?: { content?: Record<string, MediaType> };
	responses: Record<string, Response>;
	security?: Record<string, string[]>[];
	/** a write that takes no body (submit, close) */
	'x-no-body'?: boolean;
	/** an act that needs a signature: it answers only 403 with the page to sign on */
	'x-signature-required'?: boolean;
}
export interface Document {
	openapi: string;
	tags?: { name: string }[];
	paths: Record<string, Record<string, Operation>>;
	components: {
		schemas?: Record<string, Schema>;
		responses?: Record<string, Response>;
		securitySchemes?: Record<string, unknown>;
	};
}

export const METHODS = ['get', 'put', 'post', 'delete', 'patch'] as const;

/** Every operation of the document, with its place. */
export function operationsOf(doc: Document) {
	return Object.entries(doc.paths).flatMap(([path, item]) =>
		METHODS.filter((method) => item[method]).map((method) => ({
			path,
			method,
			operation: item[method]
		}))
	);
}

const escape = (segment: string) => segment.replace(/~/g, '~0').replace(/\//g, '~1');
export const pointerTo = (segments: string[]) => `#/${segments.map(escape).join('/')}`;

/** Where each schema in the document is, as pointer segments. */
export function schemaLocations(doc: Document): string[][] {
	const inContent = (base: string[], content: Record<string, MediaType> = {}) =>
		Object.keys(content)
			.filter((type) => content[type].schema !== undefined)
			.map((type) => [...base, 'content', type, 'schema']);
	const inHeaders = (base: string[], response: Response) =>
		Object.keys(response.headers ?? {}).map((name) => [...base, 'headers', name, 'schema']);
	const fromOperations = operationsOf(doc).flatMap(({ path, method, operation }) => {
		const base = ['paths', path, method];
		return [
			...(operation.parameters ?? []).map((_, i) => [...base, 'parameters', String(i), 'schema']),
			...inContent([...base, 'requestBody'], operation.requestBody?.content),
			...Object.entries(operation.responses).flatMap(([status, response]) => [
				...inContent([...base, 'responses', status], response.content),
				...inHeaders([...base, 'responses', status], response)
			])
		];
	});
	const fromComponents = [
		...Object.keys(doc.components.schemas ?? {}).map((name) => ['components', 'schemas', name]),
		...Object.entries(doc.components.responses ?? {}).flatMap(([name, response]) => [
			...inContent(['components', 'responses', name], response.content),
			...inHeaders(['components', 'responses', name], response)
		])
	];
	return [...fromOperations, ...fromComponents];
}

function at(doc: unknown, segments: string[]): unknown {
	return segments.reduce<unknown>(
		(node, key) =>
			node && typeof node === 'object' ? (node as Record<string, unknown>)[key] : undefined,
		doc
	);
}

/** Every `$ref` in the document that points at nothing. */
export function brokenRefs(doc: Document): string[] {
	const broken: string[] = [];
	const walk = (node: unknown, where: string) => {
		if (Array.isArray(node)) return node.forEach((item, i) => walk(item, `${where}/${i}`));
		if (!node || typeof node !== 'object') return;
		for (const [key, value] of Object.entries(node)) {
			if (key === '$ref' && typeof value === 'string') {
				const segments = value.startsWith('#/')
					? value
							.slice(2)
							.split('/')
							.map((s) => s.replace(/~1/g, '/').replace(/~0/g, '~'))
					: null;
				if (!segments || at(doc, segments) === undefined) broken.push(`${where}: ${value}`);
			} else walk(value, `${where}/${escape(key)}`);
		}
	};
	walk(doc, '#');
	return broken;
}

const DOCUMENT_ID = 'https://brothwright.invalid/openapi.json';

/**
 * An ajv (JSON Schema 2020-12, the dialect of OpenAPI 3.1) holding the document, so a schema at
 * any place in it compiles with its `$ref`s resolved against the document, as OpenAPI reads them.
 */
export function documentAjv(doc: Document) {
	// strict off: zod's JSON Schema output carries keywords ajv's strict mode asks to be declared.
	const ajv = new Ajv2020({ strict: false, allErrors: true });
	addFormats(ajv);
	ajv.addSchema(doc as object, DOCUMENT_ID);
	const compiled = new Map<string, ValidateFunction>();
	return {
		ajv,
		/** The validator of the schema at these pointer segments. */
		validatorAt(segments: string[]): ValidateFunction {
			const ref = `${DOCUMENT_ID}${pointerTo(segments)}`;
			if (!compiled.has(ref)) compiled.set(ref, ajv.compile({ $ref: ref }));
			return compiled.get(ref)!;
		}
	};
}

/** What keeps the document from being OpenAPI 3.1 and JSON Schema 2020-12 in every schema. */
export function structuralProblems(doc: Document): string[] {
	const { ajv, validatorAt } = documentAjv(doc);
	const shape = ajv.compile(openApi31Shape);
	const problems = shape(doc)
		? []
		: (shape.errors ?? []).map((e) => `document${e.instancePath}: ${e.message}`);
	problems.push(...brokenRefs(doc).map((ref) => `broken $ref at ${ref}`));
	for (const segments of schemaLocations(doc)) {
		const where = pointerTo(segments);
		const schema = at(doc, segments);
		if (!ajv.validateSchema(schema as object))
			problems.push(`${where}: not a JSON Schema 2020-12: ${ajv.errorsText(ajv.errors)}`);
		else
			try {
				validatorAt(segments);
			} catch (cause) {
				problems.push(`${where}: does not compile: ${(cause as Error).message}`);
			}
	}
	return problems;
}
