import { redirect } from '@sveltejs/kit';
import { listComponents } from '$lib/server/components/library';
import { ruleFailure, parseForm } from '$lib/server/forms';
import { requirePermission } from '$lib/server/guard';
import {
	defaultFeedLimits,
	listSubstanceChoices,
	oneFormPerSubstance
} from '$lib/server/studies/feed-designer';
import { loadStudyReport } from '$lib/server/studies/page-load';
import { deleteStudy } from '$lib/server/studies/study-store';
import { z } from 'zod';
import type { Actions, PageServerLoad } from './$types';
import { may } from '$lib/permissions';

export const load: PageServerLoad = async ({ params }) => {
	const user = requirePermission('study.use');
	const loaded = await loadStudyReport(params.id);
	const library = listComponents();
	const byId = new Map(library.map((c) => [c.id, c]));
	// A feed's composition also counts each hydrate or salt as its basis form; the feed weighs the first.
	const feedForms = oneFormPerSubstance(
		loaded.feeds.flatMap((f) => f.componentIds),
		byId
	);
	const designer = {
		choices: listSubstanceChoices(library, [
			...feedForms,
			...oneFormPerSubstance(loaded.basalComponentIds, byId)
		]),
		preselected: feedForms,
		limits: defaultFeedLimits(loaded.profile.group),
		maxFeedVolumeL: Math.max(0, loaded.vessel.maxWorkingVolumeL - loaded.study.initialVolumeL),
		canSaveDrafts: may(user, 'study.save-feed-drafts')
	};
	return { ...loaded, designer };
};

export const actions: Actions = {
	delete: async ({ request, params }) => {
		const actor = requirePermission('study.use');
		const formData = await request.formData();
		const confirmed = parseForm(
			z.object({ confirm: z.literal('yes', { error: 'Confirm first.' }) }),
			formData,
			[],
			'Confirm the deletion first.'
		);
		if (!confirmed.ok) return confirmed.failure;
		try {
			deleteStudy(actor, params.id);
		} catch (cause) {
			return ruleFailure(formData, cause);
		}
		redirect(303, '/studies?deleted=1');
	}
};
