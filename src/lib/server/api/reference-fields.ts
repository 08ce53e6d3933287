// A JSON Schema (as the OpenAPI document carries zod's output) read as a table of fields for
// people: each field's name, type in words, whether it is required, what it means, its allowed
// values and its rules; a nested object's fields follow it one level deeper.

export type JsonSchema = {
	type?: string | string[];
	properties?: Record<string, JsonSchema>;
	required?: string[];
	items?: JsonSchema;
	prefixItems?: JsonSchema[];
	additionalProperties?: JsonSchema | boolean;
	propertyNames?: JsonSchema;
	anyOf?: JsonSchema[];
	oneOf?: JsonSchema[];
	allOf?: JsonSchema[];
	enum?: unknown[];
	const?: unknown;
	format?: string;
	description?: string;
	default?: unknown;
	$ref?: string;
	minimum?: number;
	maximum?: number;
	exclusiveMinimum?: number;
	exclusiveMaximum?: number;
	minLength?: number;
	maxLength?: number;
	minItems?: number;
	maxItems?: number;
};

export interface FieldRow {
	name: string;
	/** 0 for a top-level field, 1 for a field of that field's object, … */
	depth: number;
	type: string;
	required: boolean;
	description: string;
	/** the values it may take, when they are listed */
	values: string[];
	/** ranges, lengths and the default, in words */
	rules: string[];
	/** a heading for one shape of a union, not a field */
	shape: boolean;
}

const show = (value: unknown) => JSON.stringify(value);

const members = (schema: JsonSchema) => schema.anyOf ?? schema.oneOf ?? [];
const isNull = (schema: JsonSchema) => schema.type === 'null';

/** The schema without its `null` alternative, and whether it had one. */
function withoutNull(schema: JsonSchema): { schema: JsonSchema; nullable: boolean } {
	const options = members(schema);
	if (options.length === 2 && options.some(isNull)) {
		const [other] = options.filter((s) => !isNull(s));
		return {
			schema: { ...other, description: schema.description ?? other.description },
			nullable: true
		};
	}
	return { schema, nullable: false };
}

const hasFields = (schema: JsonSchema) => Object.keys(schema.properties ?? {}).length > 0;

/** The type of a value as a developer writes it: `object[]`, `number | null`, `map string → number`. */
export function typeInWords(schema: JsonSchema): string {
	if (schema.$ref) return schema.$ref.split('/').pop()!;
	if (schema.const !== undefined) return show(schema.const);
	const options = members(schema);
	if (options.length) {
		const shapes = options.filter(hasFields).length;
		if (shapes > 1) return `one of ${shapes} objects`;
		const words = [...new Set(options.map(typeInWords))];
		return words.sort((a, b) => Number(a === 'null') - Number(b === 'null')).join(' | ');
	}
	if (schema.allOf?.length === 1) return typeInWords(schema.allOf[0]);
	if (Array.isArray(schema.type))
		return schema.type.map((t) => typeInWords({ ...schema, type: t })).join(' | ');
	if (schema.type === 'array') {
		if (schema.prefixItems) return `[${schema.prefixItems.map(typeInWords).join(', ')}]`;
		if (!schema.items) return 'array';
		const item = typeInWords(schema.items);
		return / /.test(item) ? `(${item})[]` : `${item}[]`;
	}
	if (schema.type === 'object' || schema.properties) {
		const values = schema.additionalProperties;
		if (!hasFields(schema) && values && typeof values === 'object')
			return `map ${schema.propertyNames?.enum ? 'name' : 'string'} → ${typeInWords(values)}`;
		return 'object';
	}
	if (schema.type === 'string' && schema.format) return `string (${schema.format})`;
	return schema.type ?? 'any';
}

const count = (n: number, what: string) => `${n} ${what}${n === 1 ? '' : 's'}`;

/** A bound worth saying: not the safe-integer limits zod gives every integer. */
const said = (bound: number | undefined): bound is number =>
	bound !== undefined && Math.abs(bound) !== Number.MAX_SAFE_INTEGER;

/** Ranges, lengths, item counts and the default, in words. */
export function rulesOf(schema: JsonSchema): string[] {
	const rules: string[] = [];
	if (said(schema.exclusiveMinimum)) rules.push(`> ${schema.exclusiveMinimum}`);
	if (said(schema.minimum)) rules.push(`≥ ${schema.minimum}`);
	if (said(schema.exclusiveMaximum)) rules.push(`< ${schema.exclusiveMaximum}`);
	if (said(schema.maximum)) rules.push(`≤ ${schema.maximum}`);
	if (schema.minLength !== undefined && schema.minLength > 0)
		rules.push(`at least ${count(schema.minLength, 'character')}`);
	if (schema.maxLength !== undefined) rules.push(`at most ${count(schema.maxLength, 'character')}`);
	if (schema.minItems !== undefined) rules.push(`at least ${count(schema.minItems, 'item')}`);
	if (schema.maxItems !== undefined) rules.push(`at most ${count(schema.maxItems, 'item')}`);
	if (schema.default !== undefined) rules.push(`default ${show(schema.default)}`);
	return rules;
}

/** The values a field may take, when the schema lists them (an enum, or a map's keys). */
export function valuesOf(schema: JsonSchema): string[] {
	const listed = schema.enum ?? schema.propertyNames?.enum;
	if (listed) return listed.map((v) => (typeof v === 'string' ? v : show(v)));
	const options = members(schema);
	if (options.length && options.every((o) => o.const !== undefined))
		return options.map((o) => (typeof o.const === 'string' ? o.const : show(o.const)));
	return [];
}

/** What sets one shape of a union apart: a field fixed to one value, e.g. `when kind is "rate"`. */
function shapeName(shape: JsonSchema, index: number): string {
	for (const [name, field] of Object.entries(shape.properties ?? {})) {
		const fixed = field.const ?? (field.enum?.length === 1 ? field.enum[0] : undefined);
		if (fixed !== undefined) return `when ${name} is ${show(fixed)}`;
	}
	return `shape ${index + 1}`;
}

/** The rows under a value: an object's fields, a list's items' fields, a map's values' fields, a union's shapes. */
export function rowsUnder(value: JsonSchema, depth: number): FieldRow[] {
	const { schema } = withoutNull(value);
	const shapes = members(schema).filter(hasFields);
	if (shapes.length > 1)
		return shapes.flatMap((shape, i) => [
			{
				name: shapeName(shape, i),
				depth,
				type: 'object',
				required: false,
				description: shape.description ?? '',
				values: [],
				rules: [],
				shape: true
			},
			...rowsUnder(shape, depth + 1)
		]);
	if (shapes.length === 1) return rowsUnder(shapes[0], depth);
	if (schema.type === 'array' && schema.items) return rowsUnder(schema.items, depth);
	if (hasFields(schema)) return fieldRows(schema, depth);
	const values = schema.additionalProperties;
	if (values && typeof values === 'object') return rowsUnder(values, depth);
	return [];
}

/** Each field of an object, each followed by the rows under it. */
function fieldRows(schema: JsonSchema, depth: number): FieldRow[] {
	const required = new Set(schema.required ?? []);
	return Object.entries(schema.properties ?? {}).flatMap(([name, field]) => [
		{
			name,
			depth,
			type: typeInWords(field),
			required: required.has(name),
			description: withoutNull(field).schema.description ?? '',
			values: valuesOf(withoutNull(field).schema),
			rules: rulesOf(withoutNull(field).schema),
			shape: false
		},
		...rowsUnder(field, depth + 1)
	]);
}
