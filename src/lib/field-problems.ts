// How a zod refusal becomes field problems and one sentence: shared by the API (problem+json) and
// the browser forms that check their request with the same schema, so both say the same words.
import type { z } from 'zod';
import { fieldLabel } from '$chemistry';

export interface FieldProblem {
	/** Dotted path of the offending input, e.g. `kinetics.muMaxPerH` or `lines.2.amount`. */
	path: string;
	message: string;
}

const joinPath = (path: readonly PropertyKey[]) => path.map(String).join('.') || '(body)';

/**
 * One problem per offending input at the dotted path a client can act on. An unknown key comes out
 * at its own path (`oxygen.o2MoleFractin`), not at the object holding it; a value that fits none of
 * a union's shapes is reported against the closest shape, the one with the fewest problems.
 */
export function zodProblems(
	issues: readonly z.core.$ZodIssue[],
	prefix: readonly PropertyKey[] = []
): FieldProblem[] {
	return issues.flatMap((issue): FieldProblem[] => {
		const path = [...prefix, ...issue.path];
		if (issue.code === 'unrecognized_keys') {
			return issue.keys.map((key) => ({
				path: joinPath([...path, key]),
				message: `Unknown field "${key}": this request has no such field; check its spelling.`
			}));
		}
		if (issue.code === 'invalid_union' && issue.errors.length > 0) {
			const candidates = issue.errors.map((memberIssues) => zodProblems(memberIssues, path));
			return candidates.reduce((closest, problems) =>
				problems.length < closest.length ? problems : closest
			);
		}
		return [{ path: joinPath(path), message: issue.message }];
	});
}

/** The refusal as a person reads it: led by the field's label unless the message already names it. */
function namedProblem({ path, message }: FieldProblem): string {
	const label = fieldLabel(path);
	return message.includes(label) || path === '(body)' ? message : `${label}: ${message}`;
}

/** A single refusal that names its own field (as the science's do) is the detail as it stands. */
export function describeProblems(errors: FieldProblem[]): string {
	if (errors.length === 1) return namedProblem(errors[0]);
	return `The request has ${errors.length} invalid fields. ${errors.map(namedProblem).join(' ')}`;
}

/** Problems by path, as a form shows them: two at one path read as one text. */
export function problemsByPath(errors: FieldProblem[]): Record<string, string> {
	const byPath: Record<string, string> = {};
	for (const e of errors)
		byPath[e.path] = byPath[e.path] ? `${byPath[e.path]} ${e.message}` : e.message;
	return byPath;
}
