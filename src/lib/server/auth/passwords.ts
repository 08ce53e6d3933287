import { hash, verify, type Algorithm } from '@node-rs/argon2';
import { dictionary } from '@zxcvbn-ts/language-common';

// OWASP's minimum argon2id profile: 19 MiB, 2 iterations, 1 lane.
const HASH_OPTIONS = {
	// The enum is `const` in the typings, which isolated modules cannot inline: 2 is Argon2id.
	algorithm: 2 as Algorithm.Argon2id,
	memoryCost: 19456,
	timeCost: 2,
	parallelism: 1
} as const;

export const MIN_PASSWORD_LENGTH = 12;

let commonPasswords: Set<string> | undefined;

function isCommon(password: string): boolean {
	commonPasswords ??= new Set(dictionary['passwords-common'] as string[]);
	const lowered = password.toLowerCase();
	// A common word padded with digits or symbols ("password1234!") is just as guessable.
	const core = lowered.replace(/[\d\W_]+$/u, '').replace(/^[\d\W_]+/u, '');
	return commonPasswords.has(lowered) || (core.length >= 4 && commonPasswords.has(core));
}

/** Returns what is wrong with a new password, or null when it is acceptable. */
export function checkPasswordPolicy(password: string): string | null {
	if (password.length < MIN_PASSWORD_LENGTH) {
		return `Use at least ${MIN_PASSWORD_LENGTH} characters (this one has ${password.length}).`;
	}
	if (password.length > 256) return 'Use at most 256 characters.';
	if (isCommon(password)) {
		return 'This password is on a list of commonly used passwords; choose another.';
	}
	return null;
}

export function hashPassword(password: string): Promise<string> {
	return hash(password, HASH_OPTIONS);
}

export async function verifyPassword(passwordHash: string, password: string): Promise<boolean> {
	try {
		return await verify(passwordHash, password);
	} catch {
		return false;
	}
}

let dummyHash: Promise<string> | undefined;

/** Spends the same time as a real check so an unknown e-mail cannot be told apart by timing. */
export async function spendVerificationTime(password: string): Promise<void> {
	dummyHash ??= hashPassword('not-a-real-account-password');
	await verifyPassword(await dummyHash, password);
}
