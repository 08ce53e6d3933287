import { error, redirect } from '@sveltejs/kit';
import { eq } from 'drizzle-orm';
import { db } from '$lib/server/db';
import { vessel } from '$lib/server/db/schema';
import { requirePermission } from '$lib/server/guard';
import { submitVessel } from '$lib/server/studies/vessel-page';
import { vesselFormValues } from '$lib/server/studies/vessel-store';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ params }) => {
	requirePermission('study.use');
	const row = db.select().from(vessel).where(eq(vessel.id, params.id)).get();
	if (!row) error(404, { message: 'No such vessel.' });
	return { values: vesselFormValues(row), name: row.name, isDemo: row.isDemo };
};

export const actions: Actions = {
	save: async ({ request, params }) => {
		const actor = requirePermission('study.use');
		const result = submitVessel(actor, await request.formData(), params.id);
		if ('failure' in result) return result.failure;
		redirect(303, `/vessels/${params.id}?saved=1`);
	}
};
