import { describe, expect, it } from 'vitest';
import { describeRoles, hasRole, isRole, ROLE_LABELS, ROLES } from '$lib/roles';
import { ACTS, may } from '$lib/permissions';
import { rolesField } from '$lib/server/role-field';
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

	it('accepts as a role only a name that has a label, and describes holders by those labels', () => {
		for (const role of ROLES) {
			expect(isRole(role)).toBe(true);
			expect(ROLE_LABELS[role], role).toMatch(/^[A-Z][a-z]+( [a-z]+)*$/);
		}
		for (const other of [
			'superuser',
			'Admin',
			'admin ',
			'',
			'inventory-lead',
			'constructor',
			'toString'
		]) {
			expect(isRole(other), JSON.stringify(other)).toBe(false);
		}
		expect(describeRoles(['engineer', 'inventory_lead'])).toBe('Process engineer, Inventory lead');
		expect(describeRoles([])).toBe('no role');
	});

	it('gives every role something to do that a person with no role cannot', () => {
		for (const role of ROLES) {
			const opened = ACTS.filter((act) => may([role], act) && !may([], act));
			expect(opened.length, role).toBeGreaterThan(0);
		}
	});

	it('lets a person with several roles do exactly what any one of them may, no more', () => {
		for (const first of ROLES) {
			for (const second of ROLES) {
				for (const act of ACTS) {
					expect(may([first, second], act), `${first} + ${second}: ${act}`).toBe(
						may([first], act) || may([second], act)
					);
				}
			}
		}
	});

	it('lets nobody signed in through only public acts, and any signed-in person through the rest of the open ones', () => {
		expect(may(null, 'session.start')).toBe(true);
		expect(may(null, 'recipe.view')).toBe(false);
		expect(may({ roles: [] }, 'recipe.view')).toBe(true);
		expect(may({ roles: [] }, 'recipe.edit')).toBe(false);
		expect(may({ roles: ['prep_technician'] }, 'recipe.sign')).toBe(false);
		expect(may({ roles: ['engineer'] }, 'recipe.sign')).toBe(true);
	});

	it('refuses an unknown role in the people form, and takes every known one', () => {
		expect(rolesField.safeParse(['superuser']).success).toBe(false);
		expect(rolesField.safeParse([]).success).toBe(false);
		expect(rolesField.parse([...ROLES])).toEqual([...ROLES]);
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
