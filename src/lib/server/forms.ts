import { fail, type ActionFailure } from '@sveltejs/kit';
import { z } from 'zod';
import { RuleError } from './rule-error';

export type FieldErrors = Record<string, string[]>;

export interface FormFailure {
	message: string;
	fieldErrors: FieldErrors;
	values: Record<string, string>;
}

// Secrets are never sent back to refill a form.
const SECRET_FIELDS = /password|token|signature/i;

export function formValues(formData: FormData): Record<string, string> {
	const values: Record<string, string> = {};
	for (const [key, value] of formData.entries()) {
		if (typeof value !== 'string' || SECRET_FIELDS.test(key)) continue;
		values[key] = key in values ? `${values[key]},${value}` : value;
	}
	return values;
}

export function formFailure(
	formData: FormData,
	message: string,
	fieldErrors: FieldErrors = {},
	status = 400
): ActionFailure<FormFailure> {
	return fail(status, { message, fieldErrors, values: formValues(formData) });
}

/** A text field read for its shape only; the domain's check says what it must hold, by its label. */
export const formText = z.string().default('');

/**
 * The revision an edit form started from, sent back with it (optimistic concurrency). Forms leave the
 * field out at revision 0, so a missing one reads as 0.
 */
export const revisionField = z.preprocess(
	(value) => value ?? '',
	z.coerce
		.number({ error: 'The page is out of date; reload it and try again.' })
		.int('The page is out of date; reload it and try again.')
		.min(0, 'The page is out of date; reload it and try again.')
);

type Parsed<S extends z.ZodType> =
	{ ok: true; data: z.infer<S> } | { ok: false; failure: ActionFailure<FormFailure> };

/**
 * Validates a form against its schema; multi-valued fields (checkbox groups) arrive as arrays. `message`
 * replaces the general one when the form has a more telling thing to say.
 */
export function parseForm<S extends z.ZodType>(
	schema: S,
	formData: FormData,
	multi: string[] = [],
	message?: string
): Parsed<S> {
	const raw: Record<string, unknown> = {};
	for (const key of new Set(formData.keys())) {
		raw[key] = multi.includes(key) ? formData.getAll(key) : formData.get(key);
	}
	for (const key of multi) raw[key] ??= [];
	const parsed = schema.safeParse(raw);
	if (parsed.success) return { ok: true, data: parsed.data };
	const fieldErrors: FieldErrors = {};
	for (const issue of parsed.error.issues) {
		const key = issue.path.map(String).join('.') || 'form';
		(fieldErrors[key] ??= []).push(issue.message);
	}
	const count = Object.keys(fieldErrors).length;
	return {
		ok: false,
		failure: formFailure(
			formData,
			message ?? `Please correct ${count === 1 ? 'the field' : `${count} fields`} marked below.`,
			fieldErrors
		)
	};
}

/** Turns a broken domain rule into a form failure that keeps what the user typed. */
export function ruleFailure(formData: FormData, cause: unknown): ActionFailure<FormFailure> {
	if (!(cause instanceof RuleError)) throw cause;
	const fieldErrors = cause.fieldErrors ?? (cause.field ? { [cause.field]: [cause.message] } : {});
	return formFailure(formData, cause.message, fieldErrors, cause.status);
}
