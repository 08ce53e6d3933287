import { describe, expect, it } from 'vitest';
import { validateSessionToken } from '$lib/server/auth/sessions';
import { signIn } from '$lib/server/auth/sign-in';
import { changeRoles, rolesOf, setActive } from '$lib/server/people';
import { makeUser } from './helpers';

describe('people administration', () => {
	it('changes roles, and refuses an empty set or an admin removing their own admin role', async () => {
		const admin = await makeUser(['admin']);
		const person = await makeUser(['engineer']);
		const actor = { id: admin.id, email: admin.email };
		changeRoles(actor, person.id, ['engineer', 'media_scientist']);
		expect(rolesOf(person.id)).toEqual(['engineer', 'media_scientist']);
		expect(() => changeRoles(actor, person.id, [])).toThrow(/at least one role/);
		expect(() => changeRoles(actor, admin.id, ['engineer'])).toThrow(/own administrator role/);
		expect(rolesOf(admin.id)).toEqual(['admin']);
	});

	it('ends every session of a deactivated person at once, and refuses their sign-in', async () => {
		const admin = await makeUser(['admin']);
		const person = await makeUser();
		const signedIn = await signIn(person.email, person.password, '127.0.0.1');
		expect(signedIn.ok).toBe(true);
		if (signedIn.ok) expect(validateSessionToken(signedIn.issued.token)).not.toBeNull();
		await setActive({ id: admin.id, email: admin.email }, person.id, false);
		if (signedIn.ok) expect(validateSessionToken(signedIn.issued.token)).toBeNull();
		expect(await signIn(person.email, person.password, '127.0.0.1')).toMatchObject({
			ok: false,
			status: 403
		});
		await expect(setActive({ id: admin.id, email: admin.email }, admin.id, false)).rejects.toThrow(
			/deactivate yourself/
		);
	});
});
