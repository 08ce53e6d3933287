import type { ActionFailure } from '@sveltejs/kit';
import type { FormFailure } from './forms';

/** Marks which of several forms on a page a failure belongs to, so only that form shows it. */
export function tagFailure<T extends ActionFailure<FormFailure>>(
	form: string,
	failure: T
): ActionFailure<FormFailure & { form: string }> {
	return Object.assign(failure, { data: { ...failure.data, form } }) as ActionFailure<
		FormFailure & { form: string }
	>;
}

/** Runs an action body and tags any failure it returns with the form's name. */
export async function tagged<R>(form: string, body: () => Promise<R> | R): Promise<R> {
	const result = await body();
	if (result && typeof result === 'object' && 'status' in result && 'data' in result) {
		const failure = result as unknown as ActionFailure<FormFailure>;
		if (failure.data && typeof failure.data === 'object' && 'message' in failure.data)
			tagFailure(form, failure);
	}
	return result;
}
