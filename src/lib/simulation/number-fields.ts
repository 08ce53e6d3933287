import { fieldLabel } from '$chemistry';
import { problemsByPath, zodProblems } from '$lib/field-problems';
import type { z } from 'zod';
import { readDecimalText } from '$lib/number-reading';

export interface SimpleField {
	key: string;
	label: string;
	hint?: string;
}

/**
 * Reads a flat set of typed numbers. Blanks are left out, for the request schema to say whether the
 * field may be left out; text that is not a number is an error at its field.
 */
export function readSimpleFields(
	fields: SimpleField[],
	values: Record<string, string>
): { numbers: Record<string, number>; textErrors: Record<string, string> } {
	const numbers: Record<string, number> = {};
	const textErrors: Record<string, string> = {};
	for (const field of fields) {
		const text = (values[field.key] ?? '').trim();
		if (text === '') continue;
		const read = readDecimalText(text, field.label);
		if (!read.ok) textErrors[field.key] = read.message;
		else numbers[field.key] = read.value;
	}
	return { numbers, textErrors };
}

/** Numbers keyed by dotted field keys (`turnaround.lagH`) as the nested request body they name. */
export function nestFields(numbers: Record<string, number>): Record<string, unknown> {
	const body: Record<string, unknown> = {};
	for (const [key, value] of Object.entries(numbers)) {
		const parts = key.split('.');
		let node = body;
		for (const part of parts.slice(0, -1)) node = (node[part] ??= {}) as Record<string, unknown>;
		node[parts[parts.length - 1]] = value;
	}
	return body;
}

export type CheckedFields<T> =
	{ ok: true; request: T } | { ok: false; fieldErrors: Record<string, string> };

/**
 * A panel's request checked with the request schema the API validates with, before it is sent: each
 * refusal at its field, in the API's words with field keys read as their labels. A field whose text
 * is not a number keeps that error; the schema's word on it (missing) would mislead.
 */
export function checkFieldsRequest<S extends z.ZodType>(
	schema: S,
	fields: SimpleField[],
	textErrors: Record<string, string>,
	body: unknown
): CheckedFields<z.output<S>> {
	const checked = schema.safeParse(body);
	if (checked.success && !Object.keys(textErrors).length)
		return { ok: true, request: checked.data };
	const problems = checked.success ? {} : problemsByPath(zodProblems(checked.error.issues));
	const others = Object.fromEntries(
		Object.entries(problems).filter(([key]) => !(key in textErrors))
	);
	return { ok: false, fieldErrors: { ...textErrors, ...relabelFieldErrors(fields, others) } };
}

const escapeRegExp = (text: string) => text.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');

/**
 * The API's messages name a field by its label in the request's words ("Lag time"); on a form they
 * read by the form's own label ("Lag (h)"), and a key left in a message reads by it too.
 */
export function relabelMessage(fields: SimpleField[], message: string): string {
	return fields.reduce((text, field) => {
		const requestLabel = fieldLabel(field.key);
		const led =
			requestLabel !== field.key && text.startsWith(`${requestLabel} `)
				? `${field.label}${text.slice(requestLabel.length)}`
				: text;
		return led.replace(
			new RegExp(`(?<![\\w.])${escapeRegExp(field.key)}(?!\\w)`, 'g'),
			field.label
		);
	}, message);
}

/** Field errors keyed by field, each message relabelled. */
export function relabelFieldErrors(
	fields: SimpleField[],
	fieldErrors: Record<string, string>
): Record<string, string> {
	return Object.fromEntries(
		Object.entries(fieldErrors).map(([key, message]) => [key, relabelMessage(fields, message)])
	);
}
