import { readableEntries } from '$lib/server/trail/entries';
import { eligibleReviewers, tellReviewers } from '$lib/server/recipes/review-queue';
import { ACKNOWLEDGEMENT_FIELD, warningsOf } from '$lib/server/recipes/open-warnings';
import { error, redirect } from '@sveltejs/kit';
import { z } from 'zod';
import { SIGNATURE_MEANINGS } from '$lib/recipes';
import { auditEventsFor } from '$lib/server/audit';
import { parseForm, ruleFailure, revisionField } from '$lib/server/forms';
import { requireActor, requirePermission } from '$lib/server/guard';
import { actorOf, versionNumber } from '$lib/server/recipes/access';
import { startDraftFrom } from '$lib/server/recipes/drafts';
import { loadVersionView } from '$lib/server/recipes/page-load';
import { findVersion } from '$lib/server/recipes/queries';
import { libraryChangesFor } from '$lib/server/recipes/snapshot';
import {
	returnToDraft,
	retireVersion,
	signingRefusal,
	signVersion,
	submitForReview,
	versionDigest
} from '$lib/server/recipes/workflow';
import type { Actions, PageServerLoad } from './$types';
import { may } from '$lib/permissions';

const submitForm = z.object({ revision: revisionField });
const signForm = z.object({
	meaning: z.enum(SIGNATURE_MEANINGS, {
		error: 'Choose what your signature means: reviewed or approved.'
	}),
	password: z.string().min(1, 'Enter your password to sign.').max(256),
	comment: z.string().max(1000, 'Keep the comment to 1 000 characters.').default('')
});
const returnForm = z.object({
	comment: z.string().trim().min(1, 'Say what needs to change, so the author knows.').max(1000)
});
const retireForm = z.object({
	confirm: z.literal('yes', { error: 'Tick the box to confirm.' }),
	reason: z.string().trim().min(1, 'Say why it is retired.').max(1000)
});

export const load: PageServerLoad = async ({ params }) => {
	const user = requirePermission('recipe.view');
	const view = loadVersionView(params);
	return {
		...view,
		digest: versionDigest(view.version),
		libraryChanges: libraryChangesFor(view.version),
		history: readableEntries(auditEventsFor('recipe_version', view.version.id, 200)).map((e) => ({
			id: e.id,
			at: e.at,
			sentence: e.sentence,
			who: e.who
		})),
		canEdit: may(user, 'recipe.edit'),
		canReview: may(user, 'recipe.sign'),
		signingRefusal: signingRefusal(user, view.version),
		openWarnings:
			view.version.status === 'in_review' && view.analysis ? warningsOf(view.analysis) : [],
		reviewers:
			view.version.status === 'in_review' ? eligibleReviewers(view.version).map((r) => r.name) : []
	};
};

/** The signer's answer to each open warning: form fields `ack.<warning key>`. */
function acknowledgementsOf(formData: FormData): Record<string, string> {
	const prefix = `${ACKNOWLEDGEMENT_FIELD}.`;
	return Object.fromEntries(
		[...formData.entries()]
			.filter(([name, value]) => name.startsWith(prefix) && typeof value === 'string')
			.map(([name, value]) => [name.slice(prefix.length), String(value).slice(0, 1000)])
	);
}

function currentVersion(params: { id: string; n: string }) {
	const version = findVersion(params.id, versionNumber(params.n));
	if (!version) error(404, { message: 'No such recipe version.' });
	return version;
}

export const actions: Actions = {
	submit: async ({ request, params }) => {
		const actor = requireActor('recipe.edit');
		const formData = await request.formData();
		const version = currentVersion(params);
		const parsed = parseForm(submitForm, formData);
		if (!parsed.ok) return parsed.failure;
		try {
			submitForReview(actor, version.id, parsed.data.revision);
		} catch (cause) {
			return ruleFailure(formData, cause);
		}
		const { told } = await tellReviewers(version);
		return { done: `Version ${version.n} is submitted for review. ${told}` };
	},
	sign: async ({ request, params }) => {
		const user = requirePermission('recipe.sign');
		const formData = await request.formData();
		const parsed = parseForm(signForm, formData);
		if (!parsed.ok) return parsed.failure;
		const version = currentVersion(params);
		try {
			await signVersion(actorOf(user), version.id, {
				...parsed.data,
				acknowledgements: acknowledgementsOf(formData)
			});
		} catch (cause) {
			return ruleFailure(formData, cause);
		}
		return {
			done:
				parsed.data.meaning === 'approved'
					? `Version ${version.n} is approved. Your signature is recorded.`
					: 'Your review signature is recorded.'
		};
	},
	sendBack: async ({ request, params }) => {
		const user = requirePermission('recipe.sign');
		const formData = await request.formData();
		const parsed = parseForm(returnForm, formData);
		if (!parsed.ok) return parsed.failure;
		const version = currentVersion(params);
		try {
			returnToDraft(actorOf(user), version.id, parsed.data.comment);
		} catch (cause) {
			return ruleFailure(formData, cause);
		}
		return { done: `Version ${version.n} is back in draft.` };
	},
	retire: async ({ request, params }) => {
		const actor = requireActor('recipe.edit');
		const formData = await request.formData();
		const parsed = parseForm(retireForm, formData);
		if (!parsed.ok) return parsed.failure;
		const version = currentVersion(params);
		try {
			retireVersion(actor, version.id, parsed.data.reason);
		} catch (cause) {
			return ruleFailure(formData, cause);
		}
		return { done: `Version ${version.n} is retired.` };
	},
	newDraft: async ({ request, params }) => {
		const actor = requireActor('recipe.edit');
		const formData = await request.formData();
		const version = currentVersion(params);
		let n: number;
		try {
			n = startDraftFrom(actor, version.id).n;
		} catch (cause) {
			return ruleFailure(formData, cause);
		}
		redirect(303, `/recipes/${params.id}/versions/${n}/edit`);
	}
};
