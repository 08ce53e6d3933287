// The one table of who may do what. Guards, navigation, endpoints and the OpenAPI `x-access` all read
// it, and tests/security/route-role-matrix.test.ts checks every door of the route tree against it. Shared with
// the browser (menus, buttons), so this module holds no server code.
import { hasRole, type Role, type RoleHolder } from './roles';

/** 'public': anyone, signed in or not; 'signed-in': any signed-in person, whatever their roles; else one of the roles. */
export type Access = 'public' | 'signed-in' | readonly Role[];

// The order of each role list is the order the refusal message names them in.
export const PERMISSIONS = {
	'session.start': 'public', // sign in, accept an invitation, reset a password
	'service.describe': 'public', // health check and the OpenAPI description
	'session.end': 'signed-in',
	'workspace.view': 'signed-in', // the signed-in shell, the overview and who am I
	'account.password': 'signed-in', // change one's own password
	'account.tokens': 'signed-in', // one's own personal API tokens: make, list, revoke

	'recipe.view': 'signed-in', // recipes, their versions, comparisons, prints and CSV
	'recipe.edit': ['media_scientist'], // create recipes; write, submit, retire drafts; start a new draft
	'recipe.sign': ['media_scientist', 'engineer'], // review and approval signatures, and sending back to draft
	'component.view': 'signed-in',
	'component.edit': ['media_scientist', 'inventory_lead'], // create, edit and import components
	'calculation.run': 'signed-in', // the stateless science endpoints (formula, stoichiometry, oxygen, sufficiency, preview ...)

	'simulation.use': ['engineer', 'media_scientist'], // the simulation pages, their endpoints (simulate, chemostat, productivity, growth fit) and saved scenarios
	'study.use': ['engineer', 'media_scientist'], // studies, organism profiles and vessels
	// Both uses studies and writes recipe drafts: the roles in both 'study.use' and 'recipe.edit'.
	'study.save-feed-drafts': ['media_scientist'],
	'run.view': 'signed-in', // runs, their data, charts and printed summaries
	'run.record': ['engineer', 'media_scientist'], // start and end runs, link batches, upload or push data, kLa measurements

	'lot.view': 'signed-in', // lots, ledgers, certificates, labels, recall, where-used
	'lot.receive': ['inventory_lead'], // receive a lot (form, CSV import, API)
	'lot.keep': ['inventory_lead'], // release, reject, adjust, dispose of a lot, attach certificates
	'inventory.manage': ['inventory_lead'], // the inventory page: expiring lots, reorder levels, the digest

	'batch.view': 'signed-in', // batches, their sheets, PDFs and lot lists, opening one by its number
	'batch.plan': ['prep_technician', 'media_scientist', 'engineer'],
	'batch.execute': ['prep_technician'], // choose lots, weigh, measure, sign as prepared
	'batch.review': ['media_scientist', 'engineer'],

	'admin.people': ['admin'], // people, invitations and roles
	'admin.outbox': ['admin'],
	'admin.audit': ['admin'],
	'admin.settings': ['admin'],
	'admin.tokens': ['admin'] // service tokens, and revoking anyone's token
} as const satisfies Record<string, Access>;

export type Act = keyof typeof PERMISSIONS;

export const ACTS = Object.keys(PERMISSIONS) as Act[];

export function accessFor(act: Act): Access {
	return PERMISSIONS[act];
}

/** The roles named for an act; empty for a public or any-signed-in act. */
export function rolesFor(act: Act): readonly Role[] {
	const access: Access = PERMISSIONS[act];
	return typeof access === 'string' ? [] : access;
}

/** Whether this person (or someone holding these roles; null for nobody signed in) may do the act. */
export function may(who: RoleHolder | readonly Role[] | null | undefined, act: Act): boolean {
	const access: Access = PERMISSIONS[act];
	if (access === 'public') return true;
	const holder = who && 'roles' in who ? who : who ? { roles: who as readonly Role[] } : null;
	if (access === 'signed-in') return holder !== null;
	return hasRole(holder, access);
}

export function isAct(value: string): value is Act {
	return Object.hasOwn(PERMISSIONS, value);
}
