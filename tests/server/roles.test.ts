import { describe, expect, it } from 'vitest';
import { hasRole, isRole, ROLES } from '$lib/roles';
import { currentHref, navigationFor } from '$lib/navigation';

describe('hasRole, the pure check behind every guard', () => {
	it('refuses when there is no user at all', () => {
		expect(hasRole(null, [])).toBe(false);
		expect(hasRole(undefined, ['admin'])).toBe(false);
	});

	it('lets any signed-in user through an empty role list', () => {
		expect(hasRole({ roles: [] }, [])).toBe(true);
	});

	it('needs one of the allowed roles, and a user may hold several', () => {
		const both = { roles: ['engineer', 'inventory_lead'] as const };
		expect(hasRole(both, ['inventory_lead'])).toBe(true);
		expect(hasRole(both, ['admin', 'engineer'])).toBe(true);
		expect(hasRole(both, ['prep_technician'])).toBe(false);
		expect(hasRole({ roles: ['media_scientist'] }, ['admin'])).toBe(false);
	});

	it('knows exactly the five roles', () => {
		expect(ROLES).toEqual(['admin', 'media_scientist', 'prep_technician', 'engineer', 'inventory_lead']);
		expect(isRole('engineer')).toBe(true);
		expect(isRole('superuser')).toBe(false);
	});

	it('shows administration only to administrators', () => {
		const adminLinks = navigationFor({ roles: ['admin'] }).map((i) => i.href);
		const engineerLinks = navigationFor({ roles: ['engineer'] }).map((i) => i.href);
		expect(adminLinks).toContain('/admin/people');
		expect(engineerLinks).not.toContain('/admin/people');
		expect(navigationFor(null)).toEqual([]);
	});
});

describe('the current menu entry', () => {
	it('is the most specific match, so a sub-page is not also its parent', () => {
		const items = navigationFor({ roles: ['prep_technician'] });
		expect(currentHref(items, '/batches/open')).toBe('/batches/open');
		expect(currentHref(items, '/batches/abc')).toBe('/batches');
		expect(currentHref(items, '/batches')).toBe('/batches');
		expect(currentHref(items, '/batchesx')).toBeNull();
		expect(currentHref(items, '/')).toBe('/');
	});
});
