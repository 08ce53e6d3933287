import { error, redirect } from '@sveltejs/kit';
import { eq } from 'drizzle-orm';
import { db } from '$lib/server/db';
import { organismProfile } from '$lib/server/db/schema';
import { requirePermission } from '$lib/server/guard';
import { profileChoices, submitProfile } from '$lib/server/studies/profile-page';
import { profileFormValues } from '$lib/server/studies/profile-store';
import { checkProfileFormula, describeProfileElements } from '$lib/server/studies/profile-elements';
import { listProfileYields } from '$chemistry';
import { listComponents } from '$lib/server/components/library';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ params }) => {
	requirePermission('study.use');
	const row = db.select().from(organismProfile).where(eq(organismProfile.id, params.id)).get();
	if (!row) error(404, { message: 'No such organism profile.' });
	const components = listComponents();
	const facts = {
		componentNames: Object.fromEntries(components.map((c) => [c.id, c.name])),
		componentFormulas: Object.fromEntries(components.map((c) => [c.id, c.formula]))
	};
	return {
		...profileChoices(),
		values: profileFormValues(row),
		name: row.name,
		isDemo: row.isDemo,
		fractionsSource: row.fractionsSource,
		yields: listProfileYields(row, facts),
		elements: describeProfileElements(row),
		formulaWarnings: checkProfileFormula(row)
	};
};

export const actions: Actions = {
	save: async ({ request, params }) => {
		const actor = requirePermission('study.use');
		const result = submitProfile(actor, await request.formData(), params.id);
		if ('failure' in result) return result.failure;
		redirect(303, `/organisms/${params.id}?saved=1`);
	}
};
