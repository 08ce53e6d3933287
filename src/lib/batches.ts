// Words and constants of batches shared by server and browser, so this module holds no server code.
import type { QuantityKind } from './inventory';
export const BATCH_STATES = ['planned', 'in_preparation', 'prepared', 'released', 'rejected'] as const;
export type BatchState = (typeof BATCH_STATES)[number];

export const BATCH_STATE_LABELS: Record<BatchState, string> = {
	planned: 'Planned',
	in_preparation: 'In preparation',
	prepared: 'Prepared',
	released: 'Released for use',
	rejected: 'Rejected'
};

export const BATCH_LINE_KINDS = ['component', 'stock'] as const;
export type BatchLineKind = (typeof BATCH_LINE_KINDS)[number];

export const DEVIATION_KINDS = ['out_of_tolerance', 'ph', 'osmolality'] as const;
export type DeviationKind = (typeof DEVIATION_KINDS)[number];

export const DEVIATION_KIND_LABELS: Record<DeviationKind, string> = {
	out_of_tolerance: 'Weighing out of tolerance',
	ph: 'pH out of range',
	osmolality: 'Osmolality out of range'
};

export const COMPLETION_MEANING = 'prepared';
export const REVIEW_MEANINGS = ['released', 'rejected'] as const;

/** Common practice for the batch-number pattern until the administrator sets one. */
export const DEFAULT_BATCH_NUMBER_PATTERN = 'MB-{YYYY}-{seq}';

/** Common practice: a measured pH within ±0.2 of the target is accepted when no range is given. */
export const DEFAULT_PH_TOLERANCE = 0.2;

export type ToleranceVerdict = 'within' | 'below' | 'above';

/** Whether an actual quantity is within ±tolerance % of the required one; the edges count as within. */
export function checkTolerance(required: number, actual: number, tolerancePercent: number): ToleranceVerdict {
	const allowance = (Math.abs(required) * tolerancePercent) / 100;
	// A relative epsilon keeps an edge value typed in decimal from falling outside by float rounding.
	const epsilon = Math.abs(required) * 1e-9;
	if (actual < required - allowance - epsilon) return 'below';
	if (actual > required + allowance + epsilon) return 'above';
	return 'within';
}

export type MassParse = { ok: true; grams: number; note?: string } | { ok: false; message: string };

// [multiply, divide]: dividing by 1000 keeps 350 mg at exactly 0.35 g.
const UNIT_FACTORS: Record<string, [number, number]> = { kg: [1000, 1], g: [1, 1], mg: [1, 1000], 'µg': [1, 1e6], ug: [1, 1e6] };

/**
 * Reads a mass as typed at the bench: "12.5", "12,5" (decimal comma), "12.5 g", "350 mg".
 * Refuses what is ambiguous ("1,250" could be either) or not a mass, with a message that says why.
 */
export function parseMassText(text: string, defaultUnit: 'g' | 'mL' = 'g'): MassParse {
	const trimmed = text.trim().replace(/\s+/g, ' ');
	if (!trimmed) return { ok: false, message: 'Enter the mass read from the balance.' };
	const match = /^([+-]?[\d.,]+)\s*([a-zA-Zµ]*)$/.exec(trimmed);
	if (!match) return { ok: false, message: `“${text.trim()}” is not a mass: type a number such as 12.5 or 12.5 g.` };
	let [, digits, unit] = match;
	unit = unit || defaultUnit;
	if (defaultUnit === 'mL') {
		const volumeFactors: Record<string, [number, number]> = { L: [1000, 1], l: [1000, 1], mL: [1, 1], ml: [1, 1], µL: [1, 1000], uL: [1, 1000], ul: [1, 1000] };
		if (!(unit in volumeFactors)) return { ok: false, message: `“${unit}” is not a volume unit here: use mL or L.` };
		const value = readDecimal(digits);
		if (!value.ok) return value;
		if (value.n <= 0) return { ok: false, message: 'The volume must be above zero.' };
		return { ok: true, grams: (value.n * volumeFactors[unit][0]) / volumeFactors[unit][1], note: value.note };
	}
	if (!(unit in UNIT_FACTORS)) return { ok: false, message: `“${unit}” is not a mass unit: use g, mg or kg.` };
	const value = readDecimal(digits);
	if (!value.ok) return value;
	if (value.n <= 0) return { ok: false, message: 'The mass must be above zero.' };
	return { ok: true, grams: (value.n * UNIT_FACTORS[unit][0]) / UNIT_FACTORS[unit][1], note: value.note };
}

function readDecimal(digits: string): { ok: true; n: number; note?: string } | { ok: false; message: string } {
	const commas = (digits.match(/,/g) ?? []).length;
	const dots = (digits.match(/\./g) ?? []).length;
	let normal = digits;
	let note: string | undefined;
	if (commas && dots) return { ok: false, message: `“${digits}” mixes commas and points: type the number with one decimal point, e.g. 1250.5.` };
	if (commas > 1 || dots > 1) return { ok: false, message: `“${digits}” has more than one decimal separator.` };
	if (commas === 1) {
		// "12,5" is a decimal comma; "1,250" could be a thousands separator, so it is refused.
		if (/,\d{3}$/.test(digits)) return { ok: false, message: `“${digits}” is ambiguous: is it ${digits.replace(',', '.')} or ${digits.replace(',', '')}? Type it with a decimal point.` };
		normal = digits.replace(',', '.');
		note = `Read the decimal comma: ${normal}`;
	}
	const n = Number(normal);
	if (!Number.isFinite(n)) return { ok: false, message: `“${digits}” is not a number.` };
	return { ok: true, n, note };
}

/** A lot offered for a batch sheet line. */
export interface LotChoice {
	id: string;
	code: string;
	expiresOn: string;
	dateKind: string;
	status: string;
	expired: boolean;
	assayPercent: number | null;
	waterContentPercent: number | null;
	onHand: number;
	quantityKind: QuantityKind;
	supplier: string;
	supplierLot: string;
}

/** One line of a batch sheet: what to weigh or add, from which lot, and what was done. */
export interface SheetLine {
	id: string;
	position: number;
	kind: 'component' | 'stock';
	name: string;
	/** The form the recipe gives the amount as, when the weighed form differs. */
	basisName: string | null;
	componentId: string | null;
	formula: string | null;
	amount: number;
	unit: string;
	note: string;
	tolerancePercent: number;
	/** µg to weigh (component) or µL to add (stock), for the chosen lot, else the suggested one, else nominal. */
	requiredQuantity: number;
	requiredFor: 'chosen' | 'suggested' | 'nominal';
	requiredText: string;
	steps: string[];
	chosen: LotChoice | null;
	suggestion: LotChoice | null;
	/** Why nothing is suggested, when nothing is. */
	suggestionNote: string | null;
	actualQuantity: number | null;
	actualText: string | null;
	doneAt: Date | null;
	doneById: string | null;
	stockSource: string;
	consumedQuantity: number | null;
	verdict: ToleranceVerdict | null;
}
