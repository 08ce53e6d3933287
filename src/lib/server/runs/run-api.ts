// The run writes of the JSON API, on the run pages' own schemas and store (run-store.ts): every
// refusal at its body path in the page's words, each answer the run with its revision as ETag.
import type { z } from 'zod';
import { withEtag } from '../api/etag';
import { problemsOfIssues, refusalOf } from '../api/refusals';
import { loadRunPage } from './run-page';
import { RUN_FORM_DEFAULTS, runBatchLinkSchema, runSchema, type RunForm } from './run-store';

type Loose = string | number | null | undefined;

/** What a person would have sent: null is an emptied field, a field left out takes the form's default. */
function formOf(body: Record<string, Loose>, base: Record<string, string> = {}) {
	const form: Record<string, unknown> = { ...base };
	for (const [key, value] of Object.entries(body)) if (value !== undefined) form[key] = value ?? '';
	return form;
}

function readForm<S extends z.ZodType>(schema: S, form: Record<string, unknown>): z.output<S> {
	const read = schema.safeParse(form);
	if (!read.success) throw refusalOf(problemsOfIssues(read.error.issues));
	return read.data;
}

/** The body through the new-run form's schema, with its defaults for the gas reference. */
export function readRunBody(body: Record<string, Loose>): RunForm {
	return readForm(runSchema, formOf(body, RUN_FORM_DEFAULTS));
}

/** The body through the run page's link form. */
export function readLinkBody(body: Record<string, Loose>): z.output<typeof runBatchLinkSchema> {
	return readForm(runBatchLinkSchema, formOf(body));
}

/** The run as its page reads it (plan, vessel, organism, batches with their lots, uploads), with its ETag. */
export function runAnswer(runId: string, created?: 201): Response {
	const page = loadRunPage(runId);
	const response = withEtag(page, page.run.revision, created);
	if (created) response.headers.set('location', `/api/v1/runs/${runId}`);
	return response;
}
