// What each act lets an API token do, in words for the token forms and the API reference. Shared
// with the browser, so no server code here.
import { PERMISSIONS, type Act } from './permissions';

/** Acts a token can never hold: its own account, people and settings, and signing (which needs a password). */
export const NEVER_BY_TOKEN: readonly Act[] = [
	'session.start',
	'service.describe',
	'session.end',
	'account.password',
	'account.tokens',
	'admin.people',
	'admin.settings',
	'admin.tokens',
	'recipe.sign',
	'batch.review'
];

export const ACT_LABELS: Record<Act, string> = {
	'session.start': 'Sign in',
	'service.describe': 'Read the API description',
	'session.end': 'Sign out',
	'workspace.view': 'Who am I (the token’s person and roles)',
	'account.password': 'Change one’s password',
	'account.tokens': 'Manage one’s API tokens',
	'recipe.view': 'Read recipes and their versions',
	'recipe.edit': 'Create recipes, write and submit drafts',
	'recipe.sign': 'Review and approve recipes',
	'component.view': 'Read the component library',
	'component.edit': 'Create and change components',
	'calculation.run':
		'Run calculations (formula, stoichiometry, oxygen, sufficiency, recipe preview)',
	'simulation.use': 'Simulate, fit growth data, keep scenarios',
	'study.use': 'Read and write studies, organism profiles and vessels',
	'study.save-feed-drafts': 'Save a designed feed as a recipe draft',
	'run.view': 'Read runs, their data and analysis',
	'run.record': 'Start and close runs, link batches, push run data',
	'lot.view': 'Read lots and their ledgers',
	'lot.receive': 'Receive lots',
	'lot.keep': 'Adjust and dispose of lots',
	'inventory.manage': 'Manage the inventory page',
	'batch.view': 'Read batches',
	'batch.plan': 'Plan batches',
	'batch.execute': 'Prepare batches at the bench',
	'batch.review': 'Review batches',
	'admin.people': 'Manage people',
	'admin.outbox': 'Read the mail outbox',
	'admin.audit': 'Read the audit trail',
	'admin.settings': 'Change site settings',
	'admin.tokens': 'Manage service tokens'
};

/** Whether an act may be a token's scope at all (before asking whether the holder's roles allow it). */
export function isTokenScope(act: Act): boolean {
	return PERMISSIONS[act] !== 'public' && !NEVER_BY_TOKEN.includes(act);
}
