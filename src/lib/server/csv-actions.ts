import { fail } from '@sveltejs/kit';
import { RuleError } from './rule-error';
import { csvTextFrom } from './csv';

/**
 * The two steps of every CSV import, as form actions: preview (write nothing) and confirm (all rows
 * or none). The pasted or uploaded text travels back so nothing typed is lost.
 */
export async function previewStep<P>(formData: FormData, preview: (text: string) => P) {
	let text = '';
	try {
		text = await csvTextFrom(formData);
		return { preview: preview(text), csv: text };
	} catch (cause) {
		if (!(cause instanceof RuleError)) throw cause;
		return fail(cause.status, { message: cause.message, csv: text });
	}
}

export async function confirmStep(
	formData: FormData,
	write: (text: string) => number,
	what: (count: number) => string
) {
	const text = typeof formData.get('csv') === 'string' ? String(formData.get('csv')) : '';
	try {
		return { done: what(write(text)), csv: '' };
	} catch (cause) {
		if (!(cause instanceof RuleError)) throw cause;
		return fail(cause.status, { message: cause.message, csv: text });
	}
}
