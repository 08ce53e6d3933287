import { countOf } from '$lib/plural';
import { error } from '@sveltejs/kit';
import { z } from 'zod';
import { may } from '$lib/permissions';
import { tagged } from '$lib/server/form-tag';
import { parseForm, ruleFailure } from '$lib/server/forms';
import { requireActor, requirePermission } from '$lib/server/guard';
import { findLot } from '$lib/server/inventory/lots';
import { materialOfLot } from '$lib/server/inventory/material';
import { recallLot, recallsOf } from '$lib/server/inventory/recall';
import { recordRetest } from '$lib/server/inventory/retest';
import { batchesMadeFromLot, RECALL_ATTENTION } from '$lib/server/inventory/where-used';
import type { Actions, PageServerLoad } from './$types';

// Shapes only: what each value must be is the recall's and the retest's to say.
const text = z.string().default('');
const recallForm = z.object({ lotAction: text, reason: text, password: text });
const retestForm = z.object({ result: text, nextRetestOn: text, password: text });

function requireLotOf(id: string) {
	const lot = findLot(id);
	if (!lot) error(404, { message: 'No lot with this id.' });
	return lot;
}

export const load: PageServerLoad = async ({ params }) => {
	const user = requirePermission('lot.view');
	const lot = requireLotOf(params.id);
	const uses = batchesMadeFromLot(lot.id).map((u) => ({
		...u,
		attention: RECALL_ATTENTION.includes(u.state)
	}));
	return {
		lot,
		componentName: materialOfLot(lot).name,
		uses,
		recalls: recallsOf(lot.id),
		canRecall: may(user, 'lot.keep')
	};
};

export const actions: Actions = {
	recall: async ({ request, params }) =>
		tagged('recall', async () => {
			const actor = requireActor('lot.keep');
			const formData = await request.formData();
			const parsed = parseForm(recallForm, formData);
			if (!parsed.ok) return parsed.failure;
			try {
				const outcome = await recallLot(actor, requireLotOf(params.id).id, parsed.data);
				const flagged = outcome.flagged.length;
				return {
					saved: `Recall signed: ${flagged} batch${flagged === 1 ? '' : 'es'} flagged${outcome.heldStocks.length ? `, stocks ${outcome.heldStocks.join(', ')} put on hold` : ''}. ${outcome.mailProblem ?? `Told by mail: ${countOf(outcome.mailed.length, 'person', 'people')}.`}`
				};
			} catch (cause) {
				return ruleFailure(formData, cause);
			}
		}),
	retest: async ({ request, params }) =>
		tagged('retest', async () => {
			const actor = requireActor('lot.keep');
			const formData = await request.formData();
			const parsed = parseForm(retestForm, formData);
			if (!parsed.ok) return parsed.failure;
			try {
				await recordRetest(actor, requireLotOf(params.id).id, parsed.data);
			} catch (cause) {
				return ruleFailure(formData, cause);
			}
			return { saved: 'Retest signed; the lot may be used again.' };
		})
};
