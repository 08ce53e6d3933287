import type { Role } from '$lib/roles';

export const DEMO_PASSWORD = 'brothwright-demo';

/**
 * One account per role at the invented site "Pilot Plant North", a second media scientist (a
 * recipe version one scientist changes is reviewed by someone else) and a second inventory lead.
 */
export const DEMO_ACCOUNTS: { email: string; name: string; roles: Role[] }[] = [
	{ email: 'admin@demo.test', name: 'Demo Administrator', roles: ['admin'] },
	{ email: 'scientist@demo.test', name: 'Demo Media Scientist', roles: ['media_scientist'] },
	{
		email: 'scientist2@demo.test',
		name: 'Demo Media Scientist (second)',
		roles: ['media_scientist']
	},
	{ email: 'technician@demo.test', name: 'Demo Prep Technician', roles: ['prep_technician'] },
	{ email: 'engineer@demo.test', name: 'Demo Process Engineer', roles: ['engineer'] },
	{ email: 'inventory@demo.test', name: 'Demo Inventory Lead', roles: ['inventory_lead'] },
	// A second inventory lead: the receiver of a lot may not release it (a site setting, on by default).
	{ email: 'stores@demo.test', name: 'Demo Stores Lead', roles: ['inventory_lead'] }
];
