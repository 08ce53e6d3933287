// The batch sheet's table and signature block as one description, drawn by the printed page
// (routes/(app)/batches/[id]/sheet) and by the PDF (pdf.ts) alike, so paper and screen agree.
import { COMPLETION_MEANING, formatLineQuantity } from '$lib/batches';
import { formatDateTime } from '$lib/date-time';
import type { PictogramId } from '$chemistry';
import type { HazardSet } from '$lib/hazards/preparation';
import type { BatchView } from './view';

export const SHEET_COLUMNS = [
	{ key: 'position', header: '#', widthPt: 20 },
	{ key: 'component', header: 'Component', widthPt: 152 },
	{ key: 'quantity', header: 'Weigh / add', widthPt: 76 },
	{ key: 'suggested', header: 'Suggested lot', widthPt: 67 },
	{ key: 'lotUsed', header: 'Lot used', widthPt: 70 },
	{ key: 'actual', header: 'Actual', widthPt: 68 },
	{ key: 'initials', header: 'Initials', widthPt: 62 }
] as const;

export type SheetColumnKey = (typeof SHEET_COLUMNS)[number]['key'];

/** A cell: its main text, smaller lines below it, GHS pictograms, or a blank to write in by hand. */
export interface SheetCell {
	text: string;
	detail?: string[];
	pictograms?: PictogramId[];
	blank?: boolean;
}

export type SheetRow = { id: string } & Record<SheetColumnKey, SheetCell>;

type ViewLine = BatchView['lines'][number];

const BLANK: SheetCell = { text: '', blank: true };

/** "Mara Quill" → "MQ": what a person writes in an initials column. */
export function initialsOf(name: string): string {
	return name
		.split(/\s+/)
		.filter(Boolean)
		.map((part) => part[0].toUpperCase())
		.join('');
}

/** "As weighed: Danger · H300 H331": the step's hazards in one line; the pictograms drawn beside. */
function hazardLine(line: ViewLine, hazards: HazardSet | undefined): string[] {
	if (!hazards?.statements.length) return [];
	const handled = line.kind === 'stock' ? 'The stock as dosed' : 'As weighed';
	const word = hazards.signalWord ? `${hazards.signalWord} · ` : '';
	return [`${handled}: ${word}${hazards.statements.map((s) => s.code).join(' ')}`];
}

function componentCell(line: ViewLine, hazards: HazardSet | undefined): SheetCell {
	const given =
		line.kind === 'stock'
			? `${line.amount} mL/L`
			: line.basisName
				? `${line.amount} ${line.unit} as ${line.basisName}`
				: `${line.amount} ${line.unit}`;
	return {
		text: line.name,
		detail: [given, ...line.steps, ...(line.note ? [line.note] : []), ...hazardLine(line, hazards)],
		pictograms: hazards?.pictograms ?? []
	};
}

function suggestedCell(line: ViewLine): SheetCell {
	if (line.doneAt || line.chosen) return { text: '—' };
	if (line.suggestion) return { text: line.suggestion.code, detail: ['first to expire'] };
	return { text: '—', detail: line.suggestionNote ? [line.suggestionNote] : [] };
}

function lotUsedCell(line: ViewLine): SheetCell {
	if (line.chosen) return { text: line.chosen.code };
	if (line.kind === 'stock' && line.stockSource) return { text: line.stockSource };
	return BLANK;
}

function actualCell(line: ViewLine): SheetCell {
	if (line.actualQuantity === null) return BLANK;
	return {
		text: formatLineQuantity(line.actualQuantity, line.kind),
		detail: line.consumedText ? [`taken from the lot: ${line.consumedText}`] : []
	};
}

/** One row per line, in the order of addition. */
export function sheetRows(view: BatchView, timeZone: string): SheetRow[] {
	return view.lines.map((line) => ({
		id: line.id,
		position: { text: String(line.position) },
		component: componentCell(line, view.preparation.lines[line.id]),
		quantity: { text: line.requiredText, detail: [`± ${line.tolerancePercent} %`] },
		suggested: suggestedCell(line),
		lotUsed: lotUsedCell(line),
		actual: actualCell(line),
		initials: line.doneByName
			? {
					text: initialsOf(line.doneByName),
					detail: line.doneAt ? [formatDateTime(line.doneAt, timeZone)] : []
				}
			: BLANK
	}));
}

export interface SignatureRow {
	role: string;
	name: string;
	meaning: string;
	at: string;
}

/**
 * The signature block: each signature given, then a blank row for each one still to come
 * (prepared, then reviewed), so a blank sheet has both and a prepared one has the review's.
 */
export function signatureRows(view: BatchView, timeZone: string): SignatureRow[] {
	const given = view.signatures.map((s) => ({
		role: s.meaning === COMPLETION_MEANING ? 'Prepared by' : 'Reviewed by',
		name: s.signerName,
		meaning: s.meaning,
		at: formatDateTime(s.signedAt, timeZone)
	}));
	const prepared = given.some((s) => s.role === 'Prepared by');
	const reviewed = given.some((s) => s.role === 'Reviewed by');
	const blank = (role: string) => ({ role, name: '', meaning: '', at: '' });
	return [
		...given,
		...(prepared ? [] : [blank('Prepared by')]),
		...(reviewed ? [] : [blank('Reviewed by')])
	];
}
