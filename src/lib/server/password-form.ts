import { z } from 'zod';
import { MIN_PASSWORD_LENGTH } from './auth/passwords';

/** A new password typed twice; the policy itself (length, common list) is checked by the domain. */
export const newPasswordFields = {
	password: z
		.string()
		.min(MIN_PASSWORD_LENGTH, `Use at least ${MIN_PASSWORD_LENGTH} characters.`)
		.max(256),
	confirm: z.string()
};

export function passwordsMatch(value: { password: string; confirm: string }): boolean {
	return value.password === value.confirm;
}

export const mismatch = { message: 'The two passwords differ.', path: ['confirm'] };
