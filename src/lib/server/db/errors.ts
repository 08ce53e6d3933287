/** The message of a SQLite refusal (a trigger's RAISE, a constraint) anywhere in an error's cause chain. */
export function sqliteRefusal(cause: unknown, pattern: RegExp): string | null {
	let current: unknown = cause;
	for (let depth = 0; current && depth < 5; depth++) {
		const error = current as { code?: unknown; message?: unknown; cause?: unknown };
		if (
			typeof error.code === 'string' &&
			error.code.startsWith('SQLITE_') &&
			typeof error.message === 'string' &&
			pattern.test(error.message)
		) {
			return error.message;
		}
		current = error.cause;
	}
	return null;
}
