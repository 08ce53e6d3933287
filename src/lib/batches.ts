// Words and constants of batches shared by server and browser, so this module holds no server code.
import type { QuantityKind } from './inventory';
import { formatReadNumber } from './number-reading';
import { formatMass, formatVolume, readAmountText, storedMass, storedVolumeUl } from './quantities';
export const BATCH_STATES = [
	'planned',
	'in_preparation',
	'prepared',
	'released',
	'rejected'
] as const;
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
export function checkTolerance(
	required: number,
	actual: number,
	tolerancePercent: number
): ToleranceVerdict {
	const allowance = (Math.abs(required) * tolerancePercent) / 100;
	// A relative epsilon keeps an edge value typed in decimal from falling outside by float rounding.
	const epsilon = Math.abs(required) * 1e-9;
	if (actual < required - allowance - epsilon) return 'below';
	if (actual > required + allowance + epsilon) return 'above';
	return 'within';
}

export type LineAmountRead =
	{ ok: true; quantity: number; readAs: string } | { ok: false; message: string };

const LINE_AMOUNT = {
	component: { label: 'Mass', units: ['g', 'mg', 'kg', 'µg'] as const, defaultUnit: 'g' as const },
	stock: { label: 'Volume', units: ['mL', 'L', 'µL'] as const, defaultUnit: 'mL' as const }
};

/**
 * Reads what a technician typed for a line ("12.5", "350 mg", "2.5 mL") into the integer the line keeps
 * in `lineQuantityUnit(kind)`: µg weighed for a component line, µL added for a stock line.
 */
export function readLineAmount(text: string, kind: BatchLineKind): LineAmountRead {
	const spec = LINE_AMOUNT[kind];
	if (kind === 'component') {
		const read = readAmountText(
			text,
			spec.label,
			LINE_AMOUNT.component.units,
			LINE_AMOUNT.component.defaultUnit
		);
		return read.ok
			? {
					ok: true,
					quantity: storedMass(read.value, read.unit, 'µg'),
					readAs: `${formatReadNumber(read.value)} ${read.unit}`
				}
			: read;
	}
	const read = readAmountText(
		text,
		spec.label,
		LINE_AMOUNT.stock.units,
		LINE_AMOUNT.stock.defaultUnit
	);
	return read.ok
		? {
				ok: true,
				quantity: storedVolumeUl(read.value, read.unit),
				readAs: `${formatReadNumber(read.value)} ${read.unit}`
			}
		: read;
}

/** The unit a line's required and actual quantities are kept in. */
export function lineQuantityUnit(kind: BatchLineKind): 'µg' | 'µL' {
	return kind === 'component' ? 'µg' : 'µL';
}

/** A line's quantity as shown on the sheet, in messages and in the browser: one rounding rule. */
export function formatLineQuantity(quantity: number, kind: BatchLineKind): string {
	return kind === 'component' ? formatMass(quantity, 'µg') : formatVolume(quantity, 'µL');
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
	/** The stock solution a stock line adds. */
	stockRecipeId: string | null;
	formula: string | null;
	amount: number;
	unit: string;
	note: string;
	tolerancePercent: number;
	/** The unit of requiredQuantity and actualQuantity: µg weighed (component) or µL added (stock). */
	quantityUnit: 'µg' | 'µL';
	/** To weigh or add, for the chosen lot, else the suggested one, else nominal; in quantityUnit. */
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
	/** Taken from the lot at completion, as text in the lot's unit. */
	consumedText: string | null;
	verdict: ToleranceVerdict | null;
}
