// Words and constants of inventory shared by server and browser, so this module holds no server code.
import { convertMass, convertVolume } from './quantities';
export const LOT_STATUSES = ['quarantine', 'released', 'rejected'] as const;
export type LotStatus = (typeof LOT_STATUSES)[number];

export const LOT_STATUS_LABELS: Record<LotStatus, string> = {
	quarantine: 'Quarantine',
	released: 'Released',
	rejected: 'Rejected'
};

export const QUANTITY_KINDS = ['mass', 'volume'] as const;
export type QuantityKind = (typeof QUANTITY_KINDS)[number];

/** The integer base unit each kind of quantity is kept in, so sums never drift. */
export const BASE_UNIT: Record<QuantityKind, 'mg' | 'µL'> = { mass: 'mg', volume: 'µL' };

export const QUANTITY_UNITS = ['kg', 'g', 'mg', 'L', 'mL', 'µL'] as const;

export const DATE_KINDS = ['expiry', 'retest'] as const;
export type DateKind = (typeof DATE_KINDS)[number];

export const LEDGER_KINDS = ['receipt', 'consumption', 'adjustment', 'disposal'] as const;
export type LedgerKind = (typeof LEDGER_KINDS)[number];

export const LEDGER_KIND_LABELS: Record<LedgerKind, string> = {
	receipt: 'Receipt',
	consumption: 'Consumption',
	adjustment: 'Adjustment',
	disposal: 'Disposal'
};

/** Common practice for an expiry warning window when the reader names none. */
export const DEFAULT_EXPIRY_WINDOW_DAYS = 30;

/**
 * A stock quantity in base units as a person reads it: 1 250 000 mg → "1.25 kg". Stock on hand reads in
 * the largest unit with up to 6 significant figures; what to weigh reads by `formatMass` in $lib/quantities.
 */
// One formatter for every call: toLocaleString builds a new one each time (0.2 ms), which an
// export of a site's ledger pays hundreds of thousands of times.
const QUANTITY_FORMAT = new Intl.NumberFormat('en-GB', { maximumFractionDigits: 3 });

export function formatQuantity(quantity: number, kind: QuantityKind): string {
	const abs = Math.abs(quantity);
	const sign = quantity < 0 ? '−' : '';
	const fmt = (n: number) => QUANTITY_FORMAT.format(Number(n.toPrecision(6)));
	if (kind === 'mass') {
		const unit = abs >= 1_000_000 ? 'kg' : abs >= 1000 ? 'g' : 'mg';
		return `${sign}${fmt(convertMass(abs, 'mg', unit))} ${unit}`;
	}
	const unit = abs >= 1_000_000 ? 'L' : abs >= 1000 ? 'mL' : 'µL';
	return `${sign}${fmt(convertVolume(abs, 'µL', unit))} ${unit}`;
}

/** Today as an ISO date (UTC), the form lot dates are kept in. */
export function isoToday(now = new Date()): string {
	return now.toISOString().slice(0, 10);
}

/** Expired is computed from the date, never stored: a lot is expired from the day after its date. */
export function isExpired(expiresOn: string, today = isoToday()): boolean {
	return expiresOn < today;
}

/** Why a lot may not go into a batch on `onDate` (its status first, then its date), or null when it may. */
export function lotUnusability(
	lot: { status: LotStatus; expiresOn: string; retestOn: string | null },
	onDate: string
): 'quarantine' | 'rejected' | 'expired' | 'retest' | null {
	if (lot.status !== 'released') return lot.status;
	if (isExpired(lot.expiresOn, onDate)) return 'expired';
	// From its retest date on, a lot waits for its retest (a recall sets it to the day of recall).
	return lot.retestOn !== null && lot.retestOn <= onDate ? 'retest' : null;
}

/** A usable lot is released, not expired and not due for retest on `onDate`. */
export function isUsableLot(
	lot: { status: LotStatus; expiresOn: string; retestOn: string | null },
	onDate: string
): boolean {
	return lotUnusability(lot, onDate) === null;
}
