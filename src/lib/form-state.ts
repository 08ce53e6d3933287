// Reading an action's failure in a page: the message, one field's errors, the values to refill.
type Failure = {
	message?: string;
	fieldErrors?: Record<string, string[]>;
	values?: Record<string, string>;
};

export function failureOf(form: unknown): Failure | null {
	return form && typeof form === 'object' && 'message' in form ? (form as Failure) : null;
}

export function fieldError(form: unknown, field: string): string | undefined {
	return failureOf(form)?.fieldErrors?.[field]?.join(' ');
}

export function refill(form: unknown, field: string, fallback = ''): string {
	return failureOf(form)?.values?.[field] ?? fallback;
}

/** Whether the failure names fields: their messages then stand beside them, not again above. */
export function hasFieldErrors(form: unknown): boolean {
	return Object.keys(failureOf(form)?.fieldErrors ?? {}).length > 0;
}
