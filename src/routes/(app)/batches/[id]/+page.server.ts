import { error, fail } from '@sveltejs/kit';
import { auditEventsFor } from '$lib/server/audit';
import { completeBatch } from '$lib/server/batches/completion';
import { requireBatch } from '$lib/server/batches/execution';
import { correctLine, correctionsOf } from '$lib/server/batches/line-correction';
import { recallFlagsOf } from '$lib/server/inventory/recall';
import { recordLineAtBench } from '$lib/server/batches/line-record';
import { hardBandPercent } from '$lib/server/batches/weighing-band';
import { chooseLot } from '$lib/server/batches/lot-choice';
import { recordMeasurements } from '$lib/server/batches/measurements';
import { reviewBatch, reviewRefusal } from '$lib/server/batches/review';
import { clientAddress, requireActor, requirePermission } from '$lib/server/guard';
import { batchView } from '$lib/server/batches/view';
import { tagged } from '$lib/server/form-tag';
import { ruleFailure, parseForm } from '$lib/server/forms';
import { RuleError } from '$lib/server/rule-error';
import { z } from 'zod';
import type { Actions, PageServerLoad } from './$types';
import { may } from '$lib/permissions';

// Shapes only: what a value must be is the batch rules' to say (RuleError names the field).
const text = z.string().default('');
const lineForm = z.object({
	lineId: z.string().min(1, 'Which line? Reload the sheet and try again.')
});
const chooseLotForm = lineForm.extend({ scan: text });
const recordLineForm = lineForm.extend({
	actual: text,
	reason: text,
	witnessEmail: text,
	witnessPassword: text
});
const correctForm = lineForm.extend({
	actual: text,
	reason: text,
	password: text,
	witnessEmail: text,
	witnessPassword: text
});
const measureForm = z.object({
	ph: text,
	osmolality: text,
	phReason: text,
	osmolalityReason: text
});
const completeForm = z.object({ password: text, comment: text });
const reviewForm = z.object({ decision: text, password: text, reason: text });

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
	const refusal =
		view.batch.state === 'prepared' ? reviewRefusal(user, requireBatch(params.id)) : null;
	return {
		...view,
		canPrepare: open && may(user, 'batch.execute'),
		hardBandPercent: hardBandPercent(),
		corrections: correctionsOf(params.id),
		recallFlags: recallFlagsOf(params.id),
		canCorrect:
			(view.batch.state === 'in_preparation' || view.batch.state === 'prepared') &&
			may(user, 'batch.execute'),
		review: view.batch.state === 'prepared' ? { allowed: refusal === null, refusal } : null,
		history: auditEventsFor('batch', params.id, 100)
	};
};

function technician() {
	return requireActor('batch.execute');
}

/** A line's failure names the line, so only its card shows the message. */
function lineFailure(formData: FormData, cause: unknown) {
	const failure = ruleFailure(formData, cause);
	return fail(failure.status, { ...failure.data, lineId: failure.data.values.lineId ?? '' });
}

function parseLineForm<S extends z.ZodType>(schema: S, formData: FormData) {
	const parsed = parseForm(schema, formData);
	if (parsed.ok) return parsed;
	const { status, data } = parsed.failure;
	return {
		ok: false as const,
		failure: fail(status, { ...data, lineId: data.values.lineId ?? '' })
	};
}

export const actions: Actions = {
	chooseLot: async ({ request, params }) => {
		const actor = technician();
		const formData = await request.formData();
		const parsed = parseLineForm(chooseLotForm, formData);
		if (!parsed.ok) return parsed.failure;
		const { lineId, scan } = parsed.data;
		try {
			const chosen = chooseLot(actor, params.id, lineId, scan);
			return {
				lineId,
				saved: chosen.repeated
					? `Lot ${chosen.lotCode} was already chosen for this line.`
					: `Lot ${chosen.lotCode} accepted: weigh ${chosen.requiredText}.`
			};
		} catch (cause) {
			return lineFailure(formData, cause);
		}
	},
	recordLine: async ({ request, params }) => {
		const actor = technician();
		const formData = await request.formData();
		const parsed = parseLineForm(recordLineForm, formData);
		if (!parsed.ok) return parsed.failure;
		const { lineId, actual, reason, witnessEmail, witnessPassword } = parsed.data;
		try {
			const done = await recordLineAtBench(actor, params.id, lineId, {
				actualText: actual,
				reason,
				witnessEmail,
				witnessPassword
			});
			return {
				lineId,
				saved: done.repeated
					? 'This line was already recorded; nothing changed.'
					: 'Line signed as done.'
			};
		} catch (cause) {
			return lineFailure(formData, cause);
		}
	},
	correctLine: async ({ request, params }) =>
		tagged('correct', async () => {
			const actor = technician();
			const formData = await request.formData();
			const parsed = parseForm(correctForm, formData);
			if (!parsed.ok) return parsed.failure;
			const { lineId, actual, reason, password, witnessEmail, witnessPassword } = parsed.data;
			try {
				await correctLine(actor, params.id, lineId, {
					actualText: actual,
					reason,
					password,
					witnessEmail,
					witnessPassword
				});
			} catch (cause) {
				return ruleFailure(formData, cause);
			}
			return { saved: 'Correction signed; the original stays on the record.' };
		}),
	measure: async ({ request, params }) =>
		tagged('measure', async () => {
			const actor = technician();
			const formData = await request.formData();
			const parsed = parseForm(measureForm, formData);
			if (!parsed.ok) return parsed.failure;
			try {
				recordMeasurements(actor, params.id, parsed.data);
			} catch (cause) {
				return ruleFailure(formData, cause);
			}
			return { saved: 'Measurements recorded.' };
		}),
	complete: async ({ request, params }) =>
		tagged('complete', async () => {
			const actor = technician();
			const formData = await request.formData();
			const parsed = parseForm(completeForm, formData);
			if (!parsed.ok) return parsed.failure;
			try {
				await completeBatch(actor, params.id, parsed.data);
			} catch (cause) {
				return ruleFailure(formData, cause);
			}
			return { saved: 'Batch signed as prepared; stock was taken from every lot used.' };
		}),
	review: async ({ request, params }) =>
		tagged('review', async () => {
			const user = requirePermission('batch.review');
			const formData = await request.formData();
			const parsed = parseForm(reviewForm, formData);
			if (!parsed.ok) return parsed.failure;
			try {
				await reviewBatch({ ...user, address: clientAddress() }, params.id, parsed.data);
			} catch (cause) {
				return ruleFailure(formData, cause);
			}
			return {
				saved: parsed.data.decision === 'rejected' ? 'Batch rejected.' : 'Batch released for use.'
			};
		})
};
