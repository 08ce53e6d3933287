import { describe, expect, it } from 'vitest';
import { decideAccess, type SignedInUser } from '$lib/server/guard';
import { makeUser } from './helpers';
import { rolesOf } from '$lib/server/people';

async function signedIn(roles: SignedInUser['roles']): Promise<SignedInUser> {
	const person = await makeUser(roles);
	return { id: person.id, email: person.email, name: 'Someone', roles: rolesOf(person.id) };
}

describe('the guard behind every load, action and endpoint', () => {
	it('sends a signed-out page visit to sign-in and back to where it was going', () => {
		expect(
			decideAccess(null, ['admin'], { pathname: '/admin/people', search: '?page=2', method: 'GET' })
		).toEqual({
			kind: 'sign-in',
			next: '/admin/people?page=2'
		});
	});

	it('answers 401 to a signed-out endpoint call or form post, never a redirect', () => {
		expect(decideAccess(null, [], { pathname: '/api/v1/me', method: 'GET' })).toMatchObject({
			kind: 'deny',
			status: 401
		});
		expect(
			decideAccess(null, [], { pathname: '/admin/people/invite', method: 'POST' })
		).toMatchObject({
			kind: 'deny',
			status: 401
		});
	});

	it('answers 403 with what is needed and what the user holds, for a real account from the database', async () => {
		const technician = await signedIn(['prep_technician']);
		const decision = decideAccess(technician, ['engineer', 'media_scientist'], {
			pathname: '/x',
			method: 'GET'
		});
		expect(decision).toMatchObject({
			kind: 'deny',
			status: 403,
			needed: 'Process engineer or Media scientist'
		});
		if (decision.kind === 'deny') {
			expect(decision.message).toContain(technician.email);
			expect(decision.message).toContain('Prep technician');
		}
	});

	it('lets in a holder of any one allowed role, and any signed-in user where no role is named', async () => {
		const both = await signedIn(['inventory_lead', 'engineer']);
		expect(decideAccess(both, ['engineer'], { pathname: '/x', method: 'POST' })).toEqual({
			kind: 'allow',
			user: both
		});
		expect(decideAccess(both, [], { pathname: '/api/v1/me', method: 'GET' }).kind).toBe('allow');
		expect(decideAccess(both, ['admin'], { pathname: '/api/v1/me', method: 'GET' })).toMatchObject({
			status: 403
		});
	});
});
