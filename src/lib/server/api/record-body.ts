// The API's writes of library records (components, organism profiles, vessels): the body is read by
// the schema of the page that writes the same record, and every refusal names its field by its body
// path in the page's own words, with the form's label in the detail a person reads.
import { z } from 'zod';
import { ApiProblem, zodProblems } from './endpoint';
import { withEtag } from './etag';
import type { FieldProblem } from './problem';
import type { LabelOf } from './field-labels';

/**
 * What `endpoint()` reads before the record's own schema does: any JSON object, passed on as sent
 * (so a key such as `__proto__` reaches the strict schema and is refused there by name).
 */
export const jsonObjectBody = z.custom<Record<string, unknown>>(
	(value) => typeof value === 'object' && value !== null && !Array.isArray(value),
	{ error: 'Send the record as a JSON object.' }
);

function sentence(text: string): string {
	return /[.!?)]$/.test(text) ? text : `${text}.`;
}

/** One problem as a person reads it: led by the field's label unless the message already names it. */
function labelled({ path, message }: FieldProblem, labelOf: LabelOf): string {
	const label = labelOf(path);
	return sentence(
		message.toLowerCase().includes(label.toLowerCase()) ? message : `${label}: ${message}`
	);
}

/** Refuses the record's fields, all at once, each at its body path; nothing was saved. */
export function fieldsRefused(problems: FieldProblem[], labelOf: LabelOf): ApiProblem {
	const listed = problems.map((p) => labelled(p, labelOf)).join(' ');
	return new ApiProblem(
		400,
		problems.length === 1
			? `Nothing was saved. ${listed}`
			: `Nothing was saved: ${problems.length} fields need correcting. ${listed}`,
		problems
	);
}

/** The body read by the page's schema: every mistake at once, each at its path in the page's words. */
export function readRecordBody<S extends z.ZodType>(
	schema: S,
	body: unknown,
	labelOf: LabelOf
): z.infer<S> {
	const parsed = schema.safeParse(body);
	if (!parsed.success) throw fieldsRefused(zodProblems(parsed.error.issues), labelOf);
	return parsed.data;
}

/** 201 for a record just made: where it lives and its ETag, so the next update can name it. */
export function createdRecord(location: string, record: unknown, revision: number): Response {
	const response = withEtag(record, revision, 201);
	response.headers.set('location', location);
	return response;
}
