import { asc, eq } from 'drizzle-orm';
import { isoToday } from '$lib/inventory';
import { may } from '$lib/permissions';
import type { Role } from '$lib/roles';
import { db, type Db } from '../db';
import { lotCertificate, type Lot } from '../db/schema';
import { RuleError } from '../rule-error';
import { digestOf, refusedSignature, signRecord } from '../signatures';
import { receiverMayNotSign } from './lot-settings';
import { applyLotStatus, checkLotStatusChange, requireLot, type LotDecision } from './lots';

type Reader = Pick<Db, 'select'>;

/** What a lot release or rejection signature means, as stored with it. */
export const LOT_SIGNATURE_MEANINGS: Record<LotDecision, string> = {
	released: 'released for use',
	rejected: 'rejected'
};

const VERBS: Record<LotDecision, string> = { released: 'release', rejected: 'reject' };
const GERUNDS: Record<LotDecision, string> = { released: 'Releasing', rejected: 'Rejecting' };

export interface LotSigner {
	id: string;
	email: string;
	roles: readonly Role[];
	address?: string | null;
}

/** Why this person may not release or reject the lot, or null when they may. */
export function lotSigningRefusal(
	signer: { id: string; roles: readonly Role[] },
	current: Lot,
	to: LotDecision,
	reader: Reader = db
): string | null {
	if (!may(signer, 'lot.keep')) return `${GERUNDS[to]} a lot needs the role Inventory lead.`;
	if (current.receivedById === signer.id && receiverMayNotSign(reader))
		return `You received this lot, so someone else must ${VERBS[to]} it.`;
	return null;
}

/** The lot's identifying content as received, the certificates by their SHA-256: what is signed. */
export function lotDigest(current: Lot, reader: Reader = db): string {
	const certificates = reader
		.select({ sha256: lotCertificate.sha256 })
		.from(lotCertificate)
		.where(eq(lotCertificate.lotId, current.id))
		.orderBy(asc(lotCertificate.sha256))
		.all()
		.map((c) => c.sha256);
	return digestOf({
		code: current.code,
		componentId: current.componentId,
		supplier: current.supplier,
		supplierLot: current.supplierLot,
		receivedOn: current.receivedOn,
		expiresOn: current.expiresOn,
		dateKind: current.dateKind,
		quantityKind: current.quantityKind,
		receivedQuantity: current.receivedQuantity,
		receivedUnit: current.receivedUnit,
		assayPercent: current.assayPercent,
		purityPercent: current.purityPercent,
		waterContentPercent: current.waterContentPercent,
		certificates
	});
}

function asDecision(value: string): LotDecision {
	if (value === 'released' || value === 'rejected') return value;
	throw new RuleError('Decision: choose release or reject.', { field: 'decision' });
}

/**
 * The electronic signature that releases or rejects a lot: password re-entered, the meaning, the
 * digest of the lot, and the status change with its audit entry, all in one transaction.
 */
export async function signLotDecision(
	signer: LotSigner,
	lotId: string,
	input: { decision: string; password: string; reason: string },
	today = isoToday()
): Promise<void> {
	const to = asDecision(input.decision);
	const current = requireLot(lotId);
	const meaning = LOT_SIGNATURE_MEANINGS[to];
	const refusal = lotSigningRefusal(signer, current, to);
	if (refusal) {
		throw refusedSignature(
			signer,
			{ subjectType: 'lot', subjectId: lotId, meaning, detail: { code: current.code } },
			refusal
		);
	}
	const reason = input.reason.trim();
	checkLotStatusChange(db, current, to, reason, today);
	const digest = lotDigest(current);
	const actor = { id: signer.id, email: signer.email, address: signer.address ?? null };
	await signRecord(
		{
			user: signer,
			password: input.password,
			meaning,
			subjectType: 'lot',
			subjectId: lotId,
			subjectDigest: digest,
			comment: reason,
			address: signer.address ?? undefined
		},
		(tx) => {
			if (lotDigest(requireLot(lotId, tx), tx) !== digest)
				throw new RuleError('This lot changed while you were signing; nothing was signed.', {
					status: 409
				});
			applyLotStatus(tx, actor, lotId, to, reason, today);
		}
	);
}
