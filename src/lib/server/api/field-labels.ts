// The form labels of a record's body paths, for refusals and the OpenAPI document. Kept apart from
// the endpoint code so the operations' descriptions load without SvelteKit (npm run api:types).
import type { z } from 'zod';

/** The form label of a body path; a path with no label is named as it stands. */
export type LabelOf = (path: string) => string;

export function labelsOf(labels: Record<string, string>): LabelOf {
	return (path) => (Object.hasOwn(labels, path) ? labels[path] : path);
}

/** Each field of a schema's shape with its description, for the OpenAPI document; parsing is unchanged. */
export function describedFields<Shape extends z.ZodRawShape>(
	shape: Shape,
	descriptions: Partial<Record<keyof Shape, string>>
): Shape {
	return Object.fromEntries(
		Object.entries(shape).map(([key, field]) => {
			const description = descriptions[key as keyof Shape];
			return [key, description ? (field as z.ZodType).describe(description) : field];
		})
	) as Shape;
}
