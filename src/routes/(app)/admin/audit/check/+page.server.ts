import { config } from '$lib/server/config';
import { db } from '$lib/server/db';
import { requirePermission } from '$lib/server/guard';
import { lastLink } from '$lib/server/trail/chain';
import { describeTrailCheck, verifyTrail } from '$lib/server/trail/verify';
import type { Actions, PageServerLoad } from './$types';

/** The newest link of each chain: noting it elsewhere lets a later check show rows cut from the end. */
function heads() {
	return {
		auditEntries: lastLink(db.$client, 'audit_event'),
		signatures: lastLink(db.$client, 'e_signature')
	};
}

export const load: PageServerLoad = async () => {
	requirePermission('admin.audit');
	return { heads: heads() };
};

export const actions: Actions = {
	default: async () => {
		requirePermission('admin.audit');
		const started = performance.now();
		const check = verifyTrail(db.$client, config.migrationsFolder);
		return {
			ok: check.ok,
			findings: describeTrailCheck(check),
			rowsChecked: check.rowsChecked,
			seconds: (performance.now() - started) / 1000,
			checkedAt: new Date().toISOString()
		};
	}
};
