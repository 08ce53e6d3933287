// What a lot label shows and the sizes it prints at, shared by the label page, its server load and
// its tests. Each size tiles A4 portrait (210 mm) inside 10 mm page margins:
// columns × widthMm + (columns − 1) × columnGapMm = 190.
import type { PictogramId } from '$chemistry';
import type { DateKind, LotStatus } from './inventory';

/** One label as the server gives it to the page; texts are as printed (no source notes). */
export interface LotLabelView {
	id: string;
	code: string;
	componentName: string;
	status: LotStatus;
	supplier: string;
	supplierLot: string;
	/** The date that governs the lot's use now (ISO), and whether it is an expiry or a retest. */
	date: { kind: DateKind; on: string };
	storage: string;
	/** GHS pictogram ids, 'GHS01'..'GHS09'. */
	pictograms: PictogramId[];
	/** The QR code as SVG markup, made on the server from `lotQrText`. */
	qr: string;
}

export const LABEL_PAGE_MARGIN_MM = 10;

export const LABEL_SIZE_IDS = ['small', 'standard', 'large'] as const;
export type LabelSizeId = (typeof LABEL_SIZE_IDS)[number];

export interface LabelSize {
	id: LabelSizeId;
	/** What the select shows. */
	label: string;
	widthMm: number;
	heightMm: number;
	columns: number;
	columnGapMm: number;
	rowGapMm: number;
}

export const LABEL_SIZES: Record<LabelSizeId, LabelSize> = {
	small: {
		id: 'small',
		label: 'Small, 60 × 25 mm: bottles and tubes (3 across)',
		widthMm: 60,
		heightMm: 25,
		columns: 3,
		columnGapMm: 5,
		rowGapMm: 2.5
	},
	standard: {
		id: 'standard',
		label: 'Standard, 93 × 45 mm (2 across)',
		widthMm: 93,
		heightMm: 45,
		columns: 2,
		columnGapMm: 4,
		rowGapMm: 4
	},
	large: {
		id: 'large',
		label: 'Large, 93 × 70 mm: drums and boxes (2 across)',
		widthMm: 93,
		heightMm: 70,
		columns: 2,
		columnGapMm: 4,
		rowGapMm: 4
	}
};

export const DEFAULT_LABEL_SIZE: LabelSizeId = 'standard';

/** The size a `?size=` value names; anything else (absent, misspelt) is the default size. */
export function labelSizeFrom(value: string | null): LabelSize {
	const id = LABEL_SIZE_IDS.find((s) => s === value) ?? DEFAULT_LABEL_SIZE;
	return LABEL_SIZES[id];
}
