import { readNumberText } from './number-text';

export interface SimpleField {
	key: string;
	label: string;
	required?: boolean;
	hint?: string;
}

/** Reads a flat set of typed numbers; blanks of optional fields are left out. */
export function readSimpleFields(
	fields: SimpleField[],
	values: Record<string, string>
):
	| { ok: true; numbers: Record<string, number> }
	| { ok: false; fieldErrors: Record<string, string> } {
	const numbers: Record<string, number> = {};
	const fieldErrors: Record<string, string> = {};
	for (const field of fields) {
		const text = (values[field.key] ?? '').trim();
		if (text === '') {
			if (field.required !== false) fieldErrors[field.key] = 'Required.';
			continue;
		}
		const value = readNumberText(text);
		if (value === null) fieldErrors[field.key] = `Enter a number (got “${text}”).`;
		else numbers[field.key] = value;
	}
	return Object.keys(fieldErrors).length ? { ok: false, fieldErrors } : { ok: true, numbers };
}

const escapeRegExp = (text: string) => text.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');

/** The API's messages name a field by its key; on a form they read by its label. */
export function relabelMessage(fields: SimpleField[], message: string): string {
	return fields.reduce(
		(text, field) =>
			text.replace(new RegExp(`(?<![\\w.])${escapeRegExp(field.key)}(?!\\w)`, 'g'), field.label),
		message
	);
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
