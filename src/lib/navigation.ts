import { may, type Act } from './permissions';
import type { RoleHolder } from './roles';

export interface NavItem {
	href: string;
	label: string;
	/** Shown to those who may do this act (`$lib/permissions`). */
	act: Act;
	section: 'Work' | 'Administration';
}

export const NAVIGATION: NavItem[] = [
	{ href: '/', label: 'Overview', act: 'workspace.view', section: 'Work' },
	{ href: '/recipes', label: 'Recipes', act: 'recipe.view', section: 'Work' },
	{ href: '/components', label: 'Components', act: 'component.view', section: 'Work' },
	{ href: '/simulation', label: 'Process simulation', act: 'simulation.use', section: 'Work' },
	{ href: '/batches', label: 'Batches', act: 'batch.view', section: 'Work' },
	{ href: '/batches/open', label: 'Scan a batch', act: 'batch.execute', section: 'Work' },
	{ href: '/lots', label: 'Lots', act: 'lot.view', section: 'Work' },
	{ href: '/inventory', label: 'Inventory', act: 'inventory.manage', section: 'Work' },
	{ href: '/studies', label: 'Studies', act: 'study.use', section: 'Work' },
	{ href: '/runs', label: 'Runs', act: 'run.view', section: 'Work' },
	{ href: '/organisms', label: 'Organisms', act: 'study.use', section: 'Work' },
	{ href: '/vessels', label: 'Vessels', act: 'study.use', section: 'Work' },
	{ href: '/admin/people', label: 'People', act: 'admin.people', section: 'Administration' },
	{ href: '/admin/outbox', label: 'Outbox', act: 'admin.outbox', section: 'Administration' },
	{ href: '/admin/audit', label: 'Audit trail', act: 'admin.audit', section: 'Administration' },
	{
		href: '/admin/tokens',
		label: 'Service tokens',
		act: 'admin.tokens',
		section: 'Administration'
	},
	{ href: '/admin/settings', label: 'Settings', act: 'admin.settings', section: 'Administration' }
];

export function navigationFor(user: RoleHolder | null): NavItem[] {
	return NAVIGATION.filter((item) => may(user, item.act));
}

function matches(href: string, pathname: string): boolean {
	return href === '/' ? pathname === '/' : pathname === href || pathname.startsWith(`${href}/`);
}

/** The one item a page belongs to: the most specific match, so /batches/open is not also under /batches. */
export function currentHref(items: NavItem[], pathname: string): string | null {
	const matching = items.filter((item) => matches(item.href, pathname));
	return matching.reduce<string | null>(
		(best, item) => (best === null || item.href.length > best.length ? item.href : best),
		null
	);
}
