/**
 * A rule of the domain that the user's request broke. Its message is written for the user;
 * forms answer it with fail(status), endpoints with a problem of that status.
 */
export class RuleError extends Error {
	readonly field?: string;
	readonly status: 400 | 403 | 404 | 409 | 422;

	constructor(message: string, options: { field?: string; status?: RuleError['status'] } = {}) {
		super(message);
		this.name = 'RuleError';
		this.field = options.field;
		this.status = options.status ?? 400;
	}
}
