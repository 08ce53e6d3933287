import { desc, eq, like, sql } from 'drizzle-orm';
import { isExpired, isoToday, LOT_STATUS_LABELS, type LotStatus } from '$lib/inventory';
import { recordAudit, type Actor } from '../audit';
import { db, type Db } from '../db';
import { sqliteRefusal } from '../db/errors';
import { lot, lotCertificate, type Lot } from '../db/schema';
import { RuleError } from '../rule-error';
import {
	insertCertificateRows,
	removeCertificateFiles,
	writeCertificateFiles,
	type CheckedUpload
} from './certificates';
import { materialOfLot } from './material';
import { appendStockEntry, onHandOf, type Tx } from './ledger';
import type { CheckedLot } from './lot-input';
import { toBaseQuantity } from './units';

type Reader = Pick<Db, 'select'>;
export type SignedActor = Actor & { id: string };

/** The next internal lot id of the year: L-2026-0001, L-2026-0002 … */
export function nextLotCode(reader: Reader, today = isoToday()): string {
	const prefix = `L-${today.slice(0, 4)}-`;
	const last = reader
		.select({ code: lot.code })
		.from(lot)
		.where(like(lot.code, `${prefix}%`))
		.orderBy(desc(lot.code))
		.get();
	const n = last ? Number(last.code.slice(prefix.length)) + 1 : 1;
	return `${prefix}${String(n).padStart(4, '0')}`;
}

function insertLot(tx: Tx, actor: SignedActor, value: CheckedLot, code?: string): Lot {
	let row: Lot;
	try {
		row = tx
			.insert(lot)
			.values({
				code: code ?? nextLotCode(tx),
				componentId: value.componentId,
				supplier: value.supplier,
				supplierLot: value.supplierLot,
				quantityKind: value.quantityKind,
				receivedQuantity: value.receivedQuantity,
				receivedUnit: value.receivedUnit,
				receivedOn: value.receivedOn,
				expiresOn: value.expiresOn,
				dateKind: value.dateKind,
				storage: value.storage,
				assayPercent: value.assayPercent,
				purityPercent: value.purityPercent,
				waterContentPercent: value.waterContentPercent,
				note: value.note,
				receivedById: actor.id
			})
			.returning()
			.get();
	} catch (cause) {
		if (sqliteRefusal(cause, /UNIQUE.*lot\.(component_id|supplier)/)) {
			throw new RuleError(
				`${value.supplier} lot ${value.supplierLot} of ${value.componentName} is already received.`,
				{ field: 'supplierLot', status: 409 }
			);
		}
		throw cause;
	}
	appendStockEntry(tx, {
		lotId: row.id,
		kind: 'receipt',
		quantity: value.receivedQuantity,
		reason: `Received ${value.receivedUnit}`,
		actorId: actor.id
	});
	recordAudit(
		actor,
		{
			action: 'lot.received',
			subjectType: 'lot',
			subjectId: row.id,
			detail: {
				code: row.code,
				component: value.componentId,
				supplier: value.supplier,
				supplierLot: value.supplierLot,
				quantity: value.receivedUnit
			}
		},
		tx
	);
	return row;
}

/**
 * Receives a lot into quarantine with its receipt entry and certificates. The files are written
 * first; if the transaction fails they are removed, so nothing is left half-stored.
 */
export function receiveLot(
	actor: SignedActor,
	value: CheckedLot,
	uploads: CheckedUpload[] = []
): Lot {
	const stored = writeCertificateFiles(uploads);
	try {
		return db.transaction((tx) => {
			const row = insertLot(tx, actor, value);
			insertCertificateRows(tx, row.id, actor.id, uploads, stored);
			return row;
		});
	} catch (cause) {
		removeCertificateFiles(stored);
		throw cause;
	}
}

/** All of them or none: one transaction for a whole import. */
export function receiveLots(actor: SignedActor, values: CheckedLot[]): Lot[] {
	return db.transaction((tx) => values.map((v) => insertLot(tx, actor, v)));
}

export function findLot(id: string, reader: Reader = db): Lot | undefined {
	return reader.select().from(lot).where(eq(lot.id, id)).get();
}

export function findLotByCode(code: string, reader: Reader = db): Lot | undefined {
	return reader
		.select()
		.from(lot)
		.where(sql`upper(${lot.code}) = upper(${code.trim()})`)
		.get();
}

export function requireLot(id: string, reader: Reader = db): Lot {
	const found = findLot(id, reader);
	if (!found) throw new RuleError('No lot with this id.', { status: 404 });
	return found;
}

const TRANSITIONS: Record<LotStatus, LotStatus[]> = {
	quarantine: ['released', 'rejected'],
	released: ['rejected'],
	rejected: []
};

export type LotDecision = 'released' | 'rejected';

/**
 * Why the lot cannot move to `to` now, thrown as a RuleError: a release needs a certificate on file
 * and an in-date lot, a rejection a reason. Checked before a signature is asked for and again inside
 * its transaction.
 */
export function checkLotStatusChange(
	reader: Reader,
	current: Lot,
	to: LotDecision,
	reason: string,
	today = isoToday()
): void {
	if (!TRANSITIONS[current.status].includes(to)) {
		throw new RuleError(
			`Lot ${current.code} is ${LOT_STATUS_LABELS[current.status].toLowerCase()}; it cannot be ${to} now.`,
			{ status: 409 }
		);
	}
	if (to === 'rejected' && reason.trim().length < 3)
		throw new RuleError('Reason: give the reason for rejecting the lot (a few words at least).', {
			field: 'reason'
		});
	if (to === 'released') {
		const certificates = reader
			.select({ id: lotCertificate.id })
			.from(lotCertificate)
			.where(eq(lotCertificate.lotId, current.id))
			.all();
		if (certificates.length === 0)
			throw new RuleError(
				`Lot ${current.code} has no certificate of analysis on file; upload it before release.`,
				{ field: 'certificates' }
			);
		if (isExpired(current.expiresOn, today))
			throw new RuleError(
				`Lot ${current.code} passed its ${current.dateKind} date (${current.expiresOn}); it cannot be released.`
			);
	}
}

/**
 * Release or reject inside the caller's transaction — the one that records the signature
 * (`signLotDecision` in lot-signing.ts). The status, who and when, and the audit entry.
 */
export function applyLotStatus(
	tx: Tx,
	actor: SignedActor,
	lotId: string,
	to: LotDecision,
	reason: string,
	today = isoToday()
): void {
	const current = requireLot(lotId, tx);
	checkLotStatusChange(tx, current, to, reason, today);
	tx.update(lot)
		.set({
			status: to,
			statusReason: reason.trim(),
			statusChangedAt: new Date(),
			statusChangedById: actor.id
		})
		.where(eq(lot.id, lotId))
		.run();
	recordAudit(
		actor,
		{
			action: `lot.${to}`,
			subjectType: 'lot',
			subjectId: lotId,
			detail: { code: current.code, from: current.status, reason: reason.trim() }
		},
		tx
	);
}

/** A stock count correction, up or down, with its reason. */
export function adjustLot(
	actor: SignedActor,
	lotId: string,
	input: { direction: 'add' | 'remove'; amount: number; unit: string; reason: string }
): void {
	db.transaction((tx) => {
		const current = requireLot(lotId, tx);
		const materials = materialOfLot(current, tx);
		const { kind, quantity } = toBaseQuantity(input.amount, input.unit, materials, {
			amount: 'amount',
			unit: 'unit'
		});
		if (kind !== current.quantityKind)
			throw new RuleError(
				`Lot ${current.code} is kept by ${current.quantityKind}; give the amount in ${current.quantityKind === 'mass' ? 'g or kg' : 'mL or L'}.`,
				{ field: 'unit' }
			);
		const signed = input.direction === 'add' ? quantity : -quantity;
		appendStockEntry(tx, {
			lotId,
			kind: 'adjustment',
			quantity: signed,
			reason: input.reason,
			actorId: actor.id
		});
		recordAudit(
			actor,
			{
				action: 'lot.adjusted',
				subjectType: 'lot',
				subjectId: lotId,
				detail: { code: current.code, quantity: signed, reason: input.reason.trim() }
			},
			tx
		);
	});
}

/** Throws away some or all of what is left. */
export function disposeLot(
	actor: SignedActor,
	lotId: string,
	input: { all: boolean; amount?: number; unit?: string; reason: string }
): void {
	db.transaction((tx) => {
		const current = requireLot(lotId, tx);
		let quantity: number;
		if (input.all) {
			quantity = onHandOf(lotId, tx);
			if (quantity <= 0)
				throw new RuleError(`Lot ${current.code} has nothing left to dispose of.`, {
					field: 'amount'
				});
		} else {
			const materials = materialOfLot(current, tx);
			const parsed = toBaseQuantity(input.amount ?? NaN, input.unit ?? '', materials, {
				amount: 'amount',
				unit: 'unit'
			});
			if (parsed.kind !== current.quantityKind)
				throw new RuleError(`Lot ${current.code} is kept by ${current.quantityKind}.`, {
					field: 'unit'
				});
			quantity = parsed.quantity;
		}
		appendStockEntry(tx, {
			lotId,
			kind: 'disposal',
			quantity: -quantity,
			reason: input.reason,
			actorId: actor.id
		});
		recordAudit(
			actor,
			{
				action: 'lot.disposed',
				subjectType: 'lot',
				subjectId: lotId,
				detail: { code: current.code, quantity: -quantity, reason: input.reason.trim() }
			},
			tx
		);
	});
}
