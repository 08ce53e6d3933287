import { error, fail } from '@sveltejs/kit';
import { may } from '$lib/permissions';
import { formValues, parseForm, ruleFailure } from '$lib/server/forms';
import { requireActor, requirePermission } from '$lib/server/guard';
import { RuleError } from '$lib/server/rule-error';
import { LEARNABLE_FIELDS, saveLearnedValues } from '$lib/server/runs/learn-profile';
import { findRun } from '$lib/server/runs/run-data';
import { loadRunPage, releasedBatchChoices } from '$lib/server/runs/run-page';
import {
	linkBatch,
	runBatchLinkSchema,
	setRunState,
	unlinkBatch
} from '$lib/server/runs/run-store';
import type { Actions, PageServerLoad } from './$types';

function runOr404(id: string) {
	try {
		return findRun(id);
	} catch (cause) {
		if (cause instanceof RuleError) error(404, { message: 'No such run.' });
		throw cause;
	}
}

export const load: PageServerLoad = async ({ params }) => {
	const user = requirePermission('run.view');
	runOr404(params.id);
	const canRecord = may(user, 'run.record');
	return {
		page: loadRunPage(params.id),
		canRecord,
		batchChoices: canRecord ? releasedBatchChoices() : []
	};
};

export const actions: Actions = {
	link: async ({ request, params }) => {
		const actor = requireActor('run.record');
		const formData = await request.formData();
		const parsed = parseForm(runBatchLinkSchema, formData);
		if (!parsed.ok) return parsed.failure;
		try {
			const linked = linkBatch(
				actor,
				runOr404(params.id).id,
				parsed.data.batchNumber,
				parsed.data.role
			);
			return { linked: linked.number };
		} catch (cause) {
			return ruleFailure(formData, cause);
		}
	},
	unlink: async ({ request, params }) => {
		const actor = requireActor('run.record');
		const formData = await request.formData();
		try {
			unlinkBatch(
				actor,
				runOr404(params.id).id,
				String(formData.get('batchId') ?? ''),
				String(formData.get('reason') ?? '')
			);
			return { unlinked: true };
		} catch (cause) {
			return ruleFailure(formData, cause);
		}
	},
	close: async ({ request, params }) => {
		const actor = requireActor('run.record');
		const formData = await request.formData();
		try {
			setRunState(actor, runOr404(params.id).id, 'closed', '');
			return { stateChanged: 'ended' };
		} catch (cause) {
			return ruleFailure(formData, cause);
		}
	},
	reopen: async ({ request, params }) => {
		const actor = requireActor('run.record');
		const formData = await request.formData();
		try {
			setRunState(actor, runOr404(params.id).id, 'open', String(formData.get('reason') ?? ''));
			return { stateChanged: 'reopened' };
		} catch (cause) {
			return ruleFailure(formData, cause);
		}
	},
	learn: async ({ request, params }) => {
		const actor = requireActor('study.use');
		const formData = await request.formData();
		const fields = formData
			.getAll('fields')
			.map(String)
			.filter((f): f is (typeof LEARNABLE_FIELDS)[number] =>
				(LEARNABLE_FIELDS as readonly string[]).includes(f)
			);
		const revision = Number(formData.get('profileRevision'));
		if (!Number.isInteger(revision))
			return fail(400, {
				message: 'The profile revision is missing; reload the page.',
				fieldErrors: {},
				values: formValues(formData)
			});
		try {
			const saved = await saveLearnedValues(actor, runOr404(params.id), fields, revision);
			return { learned: saved };
		} catch (cause) {
			return ruleFailure(formData, cause);
		}
	}
};
