import { describe, expect, it } from 'vitest';
import { hashPassword, verifyPassword } from '$lib/server/auth/passwords';
import { checkPasswordPolicy } from '$lib/server/auth/password-policy';

describe('password policy', () => {
	it('needs at least 12 characters', () => {
		expect(checkPasswordPolicy('short-pass1')).toMatch(
			/at least 12 characters \(this one has 11\)/
		);
		expect(checkPasswordPolicy('tidal-kelp-ferment')).toBeNull();
	});

	// Each of these is long enough but guessable: a repeat, a keyboard walk, a listed password
	// padded, a sequence. zxcvbn scores them below 3 and says why.
	it.each([
		['aaaaaaaaaaaa', /too easy to guess \(strength 0 of 4.*Repeated characters/],
		['qwertyuiopas', /too easy to guess.*similar to a commonly used password/],
		['1q2w3e4r5t6y', /too easy to guess/],
		['password1234!', /too easy to guess.*commonly used/],
		['abcdefghijkl', /too easy to guess/],
		['123456789012', /too easy to guess/]
	])('refuses %s with the reason', (password, reason) => {
		expect(checkPasswordPolicy(password)).toMatch(reason);
	});

	it('scores a password built from the person’s own name and address lower', () => {
		const built = 'quistmarlowe';
		expect(checkPasswordPolicy(built)).toBeNull();
		expect(checkPasswordPolicy(built, ['Marlowe Quist', 'marlowe.quist@site.example'])).toMatch(
			/too easy to guess.*personal/
		);
	});

	it('accepts a few unrelated words and refuses more than 256 characters', () => {
		expect(checkPasswordPolicy('sapphire kettle ferment')).toBeNull();
		expect(checkPasswordPolicy('x7#'.repeat(90))).toMatch(/at most 256 characters/);
	});

	it('hashes with argon2id and verifies', async () => {
		const hash = await hashPassword('tidal-kelp-ferment');
		expect(hash.startsWith('$argon2id$')).toBe(true);
		expect(await verifyPassword(hash, 'tidal-kelp-ferment')).toBe(true);
		expect(await verifyPassword(hash, 'tidal-kelp-fermenT')).toBe(false);
		expect(await verifyPassword('not a hash', 'x')).toBe(false);
	});
});
