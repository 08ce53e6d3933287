import { z } from 'zod';
import { MAX_PASSWORD_LENGTH, MIN_PASSWORD_LENGTH } from './auth/password-policy';

/** A new password typed twice; the policy itself (length, strength) is checked by the domain. */
export const newPasswordFields = {
	password: z
		.string()
		.min(MIN_PASSWORD_LENGTH, `Use at least ${MIN_PASSWORD_LENGTH} characters.`)
		.max(MAX_PASSWORD_LENGTH),
	passwordAgain: z.string()
};

export function passwordsMatch(value: { password: string; passwordAgain: string }): boolean {
	return value.password === value.passwordAgain;
}

export const mismatch = { message: 'The two passwords differ.', path: ['passwordAgain'] };
