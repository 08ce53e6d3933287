// The API reference page's content, read from the same OpenAPI document /api/v1/openapi.json serves:
// operations grouped by tag, each with who may call it, its parameters, its body and answer as
// tables of fields, and the problems it can answer.
import type { Access } from '$lib/permissions';
import { ROLE_LABELS } from '$lib/roles';
import type { buildOpenApiDocument } from './openapi';
import {
	rowsUnder,
	rulesOf,
	typeInWords,
	valuesOf,
	type FieldRow,
	type JsonSchema
} from './reference-fields';

export interface ParameterRow {
	name: string;
	in: string;
	required: boolean;
	type: string;
	description: string;
	values: string[];
	rules: string[];
}

/** A body (request or answer): its JSON as fields, and any other media types it may be. */
export interface BodyView {
	/** the JSON's own type: `object`, `object[]` … */
	type: string;
	fields: FieldRow[];
	/** other media types (e.g. text/csv) and what they hold */
	others: { mediaType: string; description: string }[];
}

export interface OperationView {
	id: string;
	method: string;
	path: string;
	summary: string;
	/** who may call it, in words */
	who: string;
	/** the scope a token needs; null when the operation is open to anyone */
	scope: string | null;
	parameters: ParameterRow[];
	request: BodyView | null;
	success: { status: string; description: string; body: BodyView | null };
	problems: { status: string; meaning: string }[];
}

export interface TagView {
	name: string;
	description: string;
	operations: OperationView[];
}

type Document = ReturnType<typeof buildOpenApiDocument>;
interface MediaType {
	schema?: JsonSchema;
}
interface RawOperation {
	operationId: string;
	tags: string[];
	summary: string;
	'x-access': Access;
	'x-act': string;
	parameters?: {
		name: string;
		in: string;
		required: boolean;
		description?: string;
		schema: JsonSchema;
	}[];
	requestBody?: { content: Record<string, MediaType> };
	responses: Record<
		string,
		{ $ref?: string; description?: string; content?: Record<string, MediaType> }
	>;
}

/** Who may: anyone, anyone signed in, or the roles' names. */
export function accessInWords(access: Access): string {
	if (access === 'public') return 'Anyone, signed in or not';
	if (access === 'signed-in') return 'Anyone signed in';
	const names = access.map((role) => ROLE_LABELS[role]);
	return names.length > 1
		? `${names.slice(0, -1).join(', ')} or ${names[names.length - 1]}`
		: names[0];
}

function bodyOf(content: Record<string, MediaType> | undefined): BodyView | null {
	if (!content) return null;
	const json = content['application/json']?.schema;
	const others = Object.entries(content)
		.filter(([type]) => type !== 'application/json')
		.map(([mediaType, media]) => ({ mediaType, description: media.schema?.description ?? '' }));
	return {
		type: json ? typeInWords(json) : '',
		fields: json ? rowsUnder(json, 0) : [],
		others
	};
}

function parameterRows(op: RawOperation): ParameterRow[] {
	return (op.parameters ?? []).map((p) => ({
		name: p.name,
		in: p.in,
		required: p.required,
		type: typeInWords(p.schema),
		description: p.description ?? p.schema.description ?? '',
		values: valuesOf(p.schema),
		rules: rulesOf(p.schema)
	}));
}

function operationView(
	method: string,
	path: string,
	op: RawOperation,
	meanings: Record<string, string>
): OperationView {
	const [success, ...rest] = Object.entries(op.responses);
	return {
		id: op.operationId,
		method: method.toUpperCase(),
		path,
		summary: op.summary,
		who: accessInWords(op['x-access']),
		scope: op['x-access'] === 'public' ? null : op['x-act'],
		parameters: parameterRows(op),
		request: bodyOf(op.requestBody?.content),
		success: {
			status: success[0],
			description: success[1].description ?? '',
			body: bodyOf(success[1].content)
		},
		problems: rest.map(([status, response]) => ({
			status,
			meaning: meanings[response.$ref?.split('/').pop() ?? ''] ?? response.description ?? ''
		}))
	};
}

/** The document's operations grouped by tag, in the document's order of tags. */
export function apiReference(document: Document): TagView[] {
	const responses = document.components.responses as Record<string, { description: string }>;
	const meanings = Object.fromEntries(
		Object.entries(responses).map(([name, r]) => [name, r.description])
	);
	const groups = new Map<string, TagView>(
		document.tags.map((tag) => [
			tag.name,
			{ name: tag.name, description: tag.description ?? '', operations: [] }
		])
	);
	for (const [path, item] of Object.entries(document.paths))
		for (const [method, raw] of Object.entries(item)) {
			const op = raw as RawOperation;
			groups.get(op.tags[0])?.operations.push(operationView(method, path, op, meanings));
		}
	return [...groups.values()].filter((group) => group.operations.length > 0);
}

export interface ProblemView {
	status: string;
	meaning: string;
	/** the example body, as JSON text */
	example: string;
}

/** Every problem the document describes, with its example body. */
export function problemsOf(document: Document): ProblemView[] {
	const responses = document.components.responses as Record<
		string,
		{ description: string; content: Record<string, { example: unknown }> }
	>;
	return Object.entries(responses).map(([name, response]) => ({
		status: name.replace(/^Problem/, ''),
		meaning: response.description,
		example: JSON.stringify(response.content['application/problem+json'].example, null, 2)
	}));
}
