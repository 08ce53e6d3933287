import { ChemistryInputError } from '$chemistry';

/**
 * A rule of the domain that the user's request broke. Its message is written for the user;
 * forms answer it with fail(status), endpoints with a problem of that status.
 */
export class RuleError extends Error {
	readonly field?: string;
	/** Several fields at once, each with its own message; `field` is then the first of them. */
	readonly fieldErrors?: Record<string, string[]>;
	readonly status: 400 | 403 | 404 | 409 | 422 | 429;

	constructor(
		message: string,
		options: {
			field?: string;
			fieldErrors?: Record<string, string[]>;
			status?: RuleError['status'];
		} = {}
	) {
		super(message);
		this.name = 'RuleError';
		this.field = options.field;
		this.fieldErrors = options.fieldErrors;
		this.status = options.status ?? 400;
	}
}

/**
 * Runs science code and answers its bad-input error as a rule error: at `field` when given, else at
 * the field the science named.
 */
export function withRuleErrors<T>(
	run: () => T,
	options: { field?: string; status?: RuleError['status'] } = {}
): T {
	try {
		return run();
	} catch (cause) {
		if (cause instanceof ChemistryInputError)
			throw new RuleError(cause.message, {
				field: options.field ?? cause.field,
				status: options.status
			});
		throw cause;
	}
}
