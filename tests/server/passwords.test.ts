import { describe, expect, it } from 'vitest';
import { checkPasswordPolicy, hashPassword, verifyPassword } from '$lib/server/auth/passwords';

describe('password policy', () => {
	it('needs at least 12 characters', () => {
		expect(checkPasswordPolicy('short-pass1')).toMatch(
			/at least 12 characters \(this one has 11\)/
		);
		expect(checkPasswordPolicy('tidal-kelp-ferment')).toBeNull();
	});

	it('refuses passwords on the common-password list, also when padded with digits', () => {
		expect(checkPasswordPolicy('qwertyuiop123')).toMatch(/commonly used/);
		expect(checkPasswordPolicy('1q2w3e4r5t6y')).toMatch(/commonly used/);
		expect(checkPasswordPolicy('password1234!')).toMatch(/commonly used/);
	});

	it('hashes with argon2id and verifies', async () => {
		const hash = await hashPassword('tidal-kelp-ferment');
		expect(hash.startsWith('$argon2id$')).toBe(true);
		expect(await verifyPassword(hash, 'tidal-kelp-ferment')).toBe(true);
		expect(await verifyPassword(hash, 'tidal-kelp-fermenT')).toBe(false);
		expect(await verifyPassword('not a hash', 'x')).toBe(false);
	});
});
