import type { z } from 'zod';
import { ApiProblem, zodProblems } from './endpoint';

/** Validates query parameters against a schema; bad ones answer 400 with their names as paths. */
export function parseQuery<S extends z.ZodType>(schema: S, url: URL): z.infer<S> {
	const raw = Object.fromEntries([...url.searchParams.entries()].filter(([, v]) => v !== ''));
	const parsed = schema.safeParse(raw);
	if (!parsed.success) {
		const errors = zodProblems(parsed.error.issues);
		throw new ApiProblem(
			400,
			`Invalid query: ${errors.map((e) => `${e.path}: ${e.message}`).join('; ')}`,
			errors
		);
	}
	return parsed.data;
}
