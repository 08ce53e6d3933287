import { hash, verify, type Algorithm } from '@node-rs/argon2';

// OWASP's minimum argon2id profile: 19 MiB, 2 iterations, 1 lane.
const HASH_OPTIONS = {
	// The enum is `const` in the typings, which isolated modules cannot inline: 2 is Argon2id.
	algorithm: 2 as Algorithm.Argon2id,
	memoryCost: 19456,
	timeCost: 2,
	parallelism: 1
} as const;

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
