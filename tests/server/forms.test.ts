import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { formText, parseForm, revisionField } from '$lib/server/forms';
import { mismatch, newPasswordFields, passwordsMatch } from '$lib/server/password-form';

const lineForm = z.object({
	lineId: z.string().min(1, 'Which line?'),
	actual: formText,
	reason: formText
});

function formOf(entries: [string, string | Blob][]): FormData {
	const formData = new FormData();
	for (const [key, value] of entries) formData.append(key, value);
	return formData;
}

describe('parseForm', () => {
	it('reads missing text fields as empty, so the domain rule says what is missing', () => {
		const parsed = parseForm(
			lineForm,
			formOf([
				['lineId', 'l1'],
				['actual', '12,5 g']
			])
		);
		expect(parsed).toEqual({ ok: true, data: { lineId: 'l1', actual: '12,5 g', reason: '' } });
	});

	it('refuses a file where text belongs with a 400 naming the field, and keeps what was typed', () => {
		const parsed = parseForm(
			lineForm,
			formOf([
				['lineId', 'l1'],
				['actual', new Blob(['x'])],
				['reason', 'spilt']
			])
		);
		expect(parsed.ok).toBe(false);
		if (parsed.ok) return;
		expect(parsed.failure.status).toBe(400);
		expect(Object.keys(parsed.failure.data.fieldErrors)).toEqual(['actual']);
		expect(parsed.failure.data.values).toEqual({ lineId: 'l1', reason: 'spilt' });
		expect(parsed.failure.data.message).toBe('Please correct the field marked below.');
	});

	it('says the form’s own message when given, and never sends a password back', () => {
		const confirmForm = z.object({
			confirm: z.literal('yes', { error: 'Confirm first.' }),
			password: formText
		});
		const parsed = parseForm(
			confirmForm,
			formOf([['password', 'secret']]),
			[],
			'Tick the box to confirm.'
		);
		expect(parsed.ok || parsed.failure.data).toEqual({
			message: 'Tick the box to confirm.',
			fieldErrors: { confirm: ['Confirm first.'] },
			values: {}
		});
	});

	it('sends back neither typing of a new password when the two differ', () => {
		const invitationForm = z
			.object({ name: formText, ...newPasswordFields })
			.refine(passwordsMatch, mismatch);
		const parsed = parseForm(
			invitationForm,
			formOf([
				['name', 'Ines Varga'],
				['password', 'sapphire kettle ferment'],
				['passwordAgain', 'sapphire kettle fermant']
			])
		);
		expect(parsed.ok || parsed.failure.data).toEqual({
			message: 'Please correct the field marked below.',
			fieldErrors: { passwordAgain: ['The two passwords differ.'] },
			values: { name: 'Ines Varga' }
		});
	});

	it('reads a revision as a whole number and refuses anything else', () => {
		const form = z.object({ revision: revisionField });
		expect(parseForm(form, formOf([['revision', '3']]))).toEqual({
			ok: true,
			data: { revision: 3 }
		});
		expect(parseForm(form, formOf([]))).toEqual({ ok: true, data: { revision: 0 } });
		const stale = parseForm(form, formOf([['revision', 'three']]));
		expect(stale.ok || stale.failure.data.fieldErrors).toEqual({
			revision: ['The page is out of date; reload it and try again.']
		});
	});
});
