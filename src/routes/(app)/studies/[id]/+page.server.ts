import { redirect } from '@sveltejs/kit';
import { hasRole } from '$lib/roles';
import { FEED_DRAFT_ROLES } from '$lib/studies';
import { listComponents } from '$lib/server/components/library';
import { parseForm, ruleFailure } from '$lib/server/forms';
import { requireStudyAccess } from '$lib/server/studies/access';
import { defaultFeedLimits, listSubstanceChoices, oneFormPerSubstance } from '$lib/server/studies/feed-designer';
import { loadStudyReport } from '$lib/server/studies/page-load';
import { deleteStudy } from '$lib/server/studies/study-store';
import { z } from 'zod';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ params }) => {
	const user = requireStudyAccess();
	const loaded = loadStudyReport(params.id);
	const library = listComponents();
	const byId = new Map(library.map((c) => [c.id, c]));
	// A feed's composition also counts each hydrate or salt as its basis form; the feed weighs the first.
	const feedForms = oneFormPerSubstance(loaded.feeds.flatMap((f) => f.componentIds), byId);
	const designer = {
		choices: listSubstanceChoices(library, [...feedForms, ...oneFormPerSubstance(loaded.basalComponentIds, byId)]),
		preselected: feedForms,
		limits: defaultFeedLimits(loaded.profile.group),
		maxFeedVolumeL: Math.max(0, loaded.vessel.maxWorkingVolumeL - loaded.study.initialVolumeL),
		canSaveDrafts: hasRole(user, FEED_DRAFT_ROLES)
	};
	return { ...loaded, designer };
};

export const actions: Actions = {
	delete: async ({ request, params }) => {
		const actor = requireStudyAccess();
		const formData = await request.formData();
		const confirmed = parseForm(z.object({ confirm: z.literal('yes', { error: 'Confirm first.' }) }), formData, [], 'Confirm the deletion first.');
		if (!confirmed.ok) return confirmed.failure;
		try {
			deleteStudy(actor, params.id);
		} catch (cause) {
			return ruleFailure(formData, cause);
		}
		redirect(303, '/studies?deleted=1');
	}
};
