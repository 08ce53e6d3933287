// A write refused by the rules its page applies, answered over the API: every problem at once, each
// at the field's path in the request body, in the page's own words.
import type { z } from 'zod';
import { zodProblems } from '$lib/field-problems';
import type { FieldErrors } from '../forms';
import { RuleError } from '../rule-error';
import { ApiProblem } from './endpoint';
import type { FieldProblem } from './problem';

/** How a page's field name reads as a path in the API's body (`feed2VolumeL` → `feeds.1.volumeL`). */
export type BodyPath = (formField: string) => string;

const samePath: BodyPath = (field) => field;

/** A form's field errors as the API's problems, one per message. */
export function problemsOfFieldErrors(
	fieldErrors: FieldErrors,
	bodyPath: BodyPath = samePath
): FieldProblem[] {
	return Object.entries(fieldErrors).flatMap(([field, messages]) =>
		messages.map((message) => ({ path: bodyPath(field), message }))
	);
}

/** A form schema's refusals as the API's problems. */
export function problemsOfIssues(
	issues: readonly z.core.$ZodIssue[],
	bodyPath: BodyPath = samePath
): FieldProblem[] {
	return zodProblems(issues).map((p) => ({ ...p, path: bodyPath(p.path) }));
}

/** The refusal of a write: nothing stored, every problem listed with its path. */
export function refusalOf(errors: FieldProblem[], status = 400): ApiProblem {
	const count = errors.length === 1 ? 'one input needs' : `${errors.length} inputs need`;
	const said = [...new Set(errors.map((e) => e.message))].join(' ');
	return new ApiProblem(status, `Nothing was saved: ${count} attention. ${said}`, errors);
}

/**
 * Runs a rule-checked write and answers a broken rule at its body path, all its fields when it
 * names several (the page shows each beside its field; so does the API).
 */
export async function withBodyPaths<T>(
	write: () => T | Promise<T>,
	bodyPath: BodyPath = samePath
): Promise<T> {
	try {
		return await write();
	} catch (cause) {
		if (!(cause instanceof RuleError) || !(cause.field || cause.fieldErrors)) throw cause;
		const fieldErrors = cause.fieldErrors ?? { [cause.field!]: [cause.message] };
		throw new ApiProblem(cause.status, cause.message, problemsOfFieldErrors(fieldErrors, bodyPath));
	}
}
