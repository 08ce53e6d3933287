import { decimalOrNaN } from '$lib/number-reading';
import { error } from '@sveltejs/kit';
import { z } from 'zod';
import type { Role } from '$lib/roles';
import { auditEventsFor } from '$lib/server/audit';
import { tagged } from '$lib/server/form-tag';
import { formFailure, parseForm, ruleFailure, formText } from '$lib/server/forms';
import { requireActor, requirePermission } from '$lib/server/guard';
import { attachCertificates, checkCertificateFiles } from '$lib/server/inventory/certificates';
import { lotSigningRefusal, signLotDecision } from '$lib/server/inventory/lot-signing';
import { adjustLot, disposeLot, findLot } from '$lib/server/inventory/lots';
import { signaturesFor } from '$lib/server/signatures';
import { decodeLedgerCursor } from '$lib/server/inventory/ledger-page';
import { lotView } from '$lib/server/inventory/view';
import { RuleError } from '$lib/server/rule-error';
import type { Actions, PageServerLoad } from './$types';

const amountField = z
	.string()
	.trim()
	.min(1, 'Enter the amount.')
	.transform(decimalOrNaN)
	.refine((n) => Number.isFinite(n) && n > 0, 'The amount must be a number above zero.');
const signForm = z.object({ decision: formText, reason: formText, password: formText });
const reasonField = z.string().trim().min(3, 'Give the reason (a few words at least).').max(500);

const adjustForm = z.object({
	direction: z.enum(['add', 'remove'], 'Choose add or remove.'),
	amount: amountField,
	unit: z.string().min(1),
	reason: reasonField
});
const disposeForm = z.object({
	all: z.literal('yes').optional(),
	amount: z.string().optional(),
	unit: z.string().optional(),
	reason: reasonField,
	confirm: z.literal('yes', 'Tick the box to confirm the disposal.')
});

/** What the person may sign on this lot now: the decisions open, or why they may not sign. */
function signingFor(user: { id: string; roles: readonly Role[] }, lotId: string) {
	const current = findLot(lotId);
	if (!current || current.status === 'rejected') return null;
	const decisions =
		current.status === 'quarantine' ? (['released', 'rejected'] as const) : (['rejected'] as const);
	const refusal = lotSigningRefusal(user, current, decisions[0]);
	return { decisions: [...decisions], allowed: refusal === null, refusal };
}

const WHERE_USED_SHOWN = 100;

export const load: PageServerLoad = async ({ params, url }) => {
	const user = requirePermission('lot.view');
	try {
		const before = url.searchParams.get('ledgerBefore');
		// A cursor that does not read falls back to the latest entries, as a stale bookmark should.
		const view = lotView(params.id, { ledgerBefore: before ? decodeLedgerCursor(before) : null });
		return {
			...view,
			// A lot in a site's every batch would make the page heavy: the rest are in the CSV.
			whereUsed: view.whereUsed.slice(0, WHERE_USED_SHOWN),
			whereUsedTotal: view.whereUsed.length,
			ledgerPaged: before !== null && before !== '',
			signing: signingFor(user, params.id),
			signatures: signaturesFor('lot', [params.id]),
			history: auditEventsFor('lot', params.id),
			received: url.searchParams.has('received')
		};
	} catch (cause) {
		if (cause instanceof RuleError && cause.status === 404) error(404, { message: cause.message });
		throw cause;
	}
};

function keeper() {
	return requireActor('lot.keep');
}

export const actions: Actions = {
	sign: async ({ request, params }) =>
		tagged('sign', async () => {
			const actor = keeper();
			const formData = await request.formData();
			const parsed = parseForm(signForm, formData);
			if (!parsed.ok) return parsed.failure;
			try {
				await signLotDecision(actor, params.id, parsed.data);
			} catch (cause) {
				return ruleFailure(formData, cause);
			}
			return {
				saved:
					parsed.data.decision === 'rejected'
						? 'Rejected and signed: the lot will not be offered for batches.'
						: 'Released and signed: the lot can now be used in batches.'
			};
		}),
	upload: async ({ request, params }) =>
		tagged('upload', async () => {
			const actor = keeper();
			const formData = await request.formData();
			try {
				const uploads = await checkCertificateFiles(formData);
				const added = attachCertificates(actor, params.id, uploads);
				return {
					saved: `${added} certificate${added === 1 ? '' : 's'} stored.`
				};
			} catch (cause) {
				return ruleFailure(formData, cause);
			}
		}),
	adjust: async ({ request, params }) =>
		tagged('adjust', async () => {
			const actor = keeper();
			const formData = await request.formData();
			const parsed = parseForm(adjustForm, formData);
			if (!parsed.ok) return parsed.failure;
			try {
				adjustLot(actor, params.id, parsed.data);
			} catch (cause) {
				return ruleFailure(formData, cause);
			}
			return { saved: 'Adjustment recorded in the ledger.' };
		}),
	dispose: async ({ request, params }) =>
		tagged('dispose', async () => {
			const actor = keeper();
			const formData = await request.formData();
			const parsed = parseForm(disposeForm, formData);
			if (!parsed.ok) return parsed.failure;
			const all = parsed.data.all === 'yes';
			const amount = decimalOrNaN(parsed.data.amount ?? '');
			if (!all && !(parsed.data.amount ?? '').trim()) {
				return formFailure(
					formData,
					'Enter the amount to dispose of, or tick “all that is left”.',
					{ amount: ['Enter the amount.'] }
				);
			}
			try {
				disposeLot(actor, params.id, {
					all,
					amount,
					unit: parsed.data.unit,
					reason: parsed.data.reason
				});
			} catch (cause) {
				return ruleFailure(formData, cause);
			}
			return { saved: 'Disposal recorded in the ledger.' };
		})
};
