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
): { ok: true; numbers: Record<string, number> } | { ok: false; fieldErrors: Record<string, string> } {
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
