import { error, fail } from '@sveltejs/kit';
import { auditEventsFor } from '$lib/server/audit';
import { completeBatch, chooseLot, recordLine, recordMeasurements, requireBatch } from '$lib/server/batches/execution';
import { reviewBatch, reviewRefusal } from '$lib/server/batches/review';
import { clientAddress, requireActor, requirePermission } from '$lib/server/guard';
import { batchView } from '$lib/server/batches/view';
import { tagged } from '$lib/server/form-tag';
import { formValues, ruleFailure } from '$lib/server/forms';
import { RuleError } from '$lib/server/rule-error';
import type { Actions, PageServerLoad } from './$types';
import { may } from '$lib/permissions';

export const load: PageServerLoad = async ({ params }) => {
	const user = requirePermission('batch.view');
	let view;
	try {
		view = batchView(params.id);
	} catch (cause) {
		if (cause instanceof RuleError && cause.status === 404) error(404, { message: cause.message });
		throw cause;
	}
	const open = view.batch.state === 'planned' || view.batch.state === 'in_preparation';
	const refusal = view.batch.state === 'prepared' ? reviewRefusal(user, requireBatch(params.id)) : null;
	return {
		...view,
		canPrepare: open && may(user, 'batch.execute'),
		review: view.batch.state === 'prepared' ? { allowed: refusal === null, refusal } : null,
		history: auditEventsFor('batch', params.id).slice(0, 100)
	};
};

function technician() {
	return requireActor('batch.execute');
}

/** A line's failure names the line, so only its card shows the message. */
function lineFailure(formData: FormData, cause: unknown) {
	const failure = ruleFailure(formData, cause);
	return fail(failure.status, { ...failure.data, lineId: String(formData.get('lineId') ?? '') });
}

export const actions: Actions = {
	chooseLot: async ({ request, params }) => {
		const actor = technician();
		const formData = await request.formData();
		try {
			const chosen = chooseLot(actor, params.id, String(formData.get('lineId') ?? ''), String(formData.get('scan') ?? ''));
			return { lineId: String(formData.get('lineId')), saved: chosen.repeated ? `Lot ${chosen.lotCode} was already chosen for this line.` : `Lot ${chosen.lotCode} accepted: weigh ${chosen.requiredText}.` };
		} catch (cause) {
			return lineFailure(formData, cause);
		}
	},
	recordLine: async ({ request, params }) => {
		const actor = technician();
		const formData = await request.formData();
		try {
			const done = recordLine(actor, params.id, String(formData.get('lineId') ?? ''), {
				actualText: String(formData.get('actual') ?? ''),
				reason: String(formData.get('reason') ?? ''),
				stockSource: String(formData.get('stockSource') ?? '')
			});
			return { lineId: String(formData.get('lineId')), saved: done.repeated ? 'This line was already recorded; nothing changed.' : 'Line signed as done.' };
		} catch (cause) {
			return lineFailure(formData, cause);
		}
	},
	measure: async ({ request, params }) =>
		tagged('measure', async () => {
			const actor = technician();
			const formData = await request.formData();
			try {
				recordMeasurements(actor, params.id, {
					ph: String(formData.get('ph') ?? ''),
					osmolality: String(formData.get('osmolality') ?? ''),
					phReason: String(formData.get('phReason') ?? ''),
					osmolalityReason: String(formData.get('osmolalityReason') ?? '')
				});
			} catch (cause) {
				return ruleFailure(formData, cause);
			}
			return { saved: 'Measurements recorded.' };
		}),
	complete: async ({ request, params }) =>
		tagged('complete', async () => {
			const actor = technician();
			const formData = await request.formData();
			try {
				await completeBatch(actor, params.id, { password: String(formData.get('password') ?? ''), comment: String(formData.get('comment') ?? '') });
			} catch (cause) {
				return ruleFailure(formData, cause);
			}
			return { saved: 'Batch signed as prepared; stock was taken from every lot used.' };
		}),
	review: async ({ request, params }) =>
		tagged('review', async () => {
			const user = requirePermission('batch.review');
			const formData = await request.formData();
			try {
				await reviewBatch({ ...user, address: clientAddress() }, params.id, {
					decision: String(formData.get('decision') ?? ''),
					password: String(formData.get('password') ?? ''),
					reason: String(formData.get('reason') ?? '')
				});
			} catch (cause) {
				return ruleFailure(formData, cause);
			}
			return { saved: formValues(formData).decision === 'rejected' ? 'Batch rejected.' : 'Batch released for use.' };
		})
};
