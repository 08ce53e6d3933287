import { hasRole, type Role, type RoleHolder } from './roles';
import { STUDY_ROLES } from './studies';

export interface NavItem {
	href: string;
	label: string;
	/** Empty: every signed-in user. */
	roles: Role[];
	section: 'Work' | 'Administration';
}

export const NAVIGATION: NavItem[] = [
	{ href: '/', label: 'Overview', roles: [], section: 'Work' },
	{ href: '/recipes', label: 'Recipes', roles: [], section: 'Work' },
	{ href: '/components', label: 'Components', roles: [], section: 'Work' },
	{ href: '/simulation', label: 'Process simulation', roles: ['engineer', 'media_scientist'], section: 'Work' },
	{ href: '/batches', label: 'Batches', roles: [], section: 'Work' },
	{ href: '/batches/open', label: 'Scan a batch', roles: ['prep_technician'], section: 'Work' },
	{ href: '/lots', label: 'Lots', roles: [], section: 'Work' },
	{ href: '/inventory', label: 'Inventory', roles: ['inventory_lead'], section: 'Work' },
	{ href: '/studies', label: 'Studies', roles: [...STUDY_ROLES], section: 'Work' },
	{ href: '/organisms', label: 'Organisms', roles: [...STUDY_ROLES], section: 'Work' },
	{ href: '/vessels', label: 'Vessels', roles: [...STUDY_ROLES], section: 'Work' },
	{ href: '/admin/people', label: 'People', roles: ['admin'], section: 'Administration' },
	{ href: '/admin/outbox', label: 'Outbox', roles: ['admin'], section: 'Administration' },
	{ href: '/admin/audit', label: 'Audit trail', roles: ['admin'], section: 'Administration' },
	{ href: '/admin/settings', label: 'Settings', roles: ['admin'], section: 'Administration' }
];

export function navigationFor(user: RoleHolder | null): NavItem[] {
	return NAVIGATION.filter((item) => hasRole(user, item.roles));
}

function matches(href: string, pathname: string): boolean {
	return href === '/' ? pathname === '/' : pathname === href || pathname.startsWith(`${href}/`);
}

/** The one item a page belongs to: the most specific match, so /batches/open is not also under /batches. */
export function currentHref(items: NavItem[], pathname: string): string | null {
	const matching = items.filter((item) => matches(item.href, pathname));
	return matching.reduce<string | null>((best, item) => (best === null || item.href.length > best.length ? item.href : best), null);
}
