import { PDFDocument, StandardFonts } from 'pdf-lib';
import { MARGIN, Writer, type TableColumn } from '../pdf/layout';
import { changeText, trailTimeText, type TrailEntry } from './entries';

// Widths in points; together they fill A4 between the margins (595 − 2 × 40).
const COLUMNS: TableColumn[] = [
	{ header: 'When', width: 62 },
	{ header: 'Person', width: 78 },
	{ header: 'Subject', width: 95 },
	{ header: 'What happened', width: 150 },
	{ header: 'Changes', width: 130 }
];

/** The filtered trail as a PDF: a heading naming the filter, then one table row per entry. */
export async function buildTrailPdf(
	entries: TrailEntry[],
	options: { filterSummary: string; printedAt?: Date }
): Promise<Uint8Array> {
	const printedAt = options.printedAt ?? new Date();
	const doc = await PDFDocument.create();
	doc.setTitle('Audit trail');
	doc.setSubject(options.filterSummary);
	doc.setCreator('Brothwright');
	const font = await doc.embedFont(StandardFonts.Helvetica);
	const bold = await doc.embedFont(StandardFonts.HelveticaBold);
	const w = new Writer(doc, font, bold);
	w.text('Brothwright audit trail', { size: 16, bold: true });
	w.text(`Printed ${trailTimeText(printedAt)} · ${options.filterSummary}`, { size: 8.5 });
	w.text(`${entries.length} ${entries.length === 1 ? 'entry' : 'entries'}`, { size: 8.5 });
	w.gap(8);
	if (entries.length === 0) {
		w.text('No entries match this filter.');
	} else {
		w.table(
			COLUMNS,
			entries.map((e) => [
				e.atText,
				e.whoEmail && e.whoEmail !== e.who ? `${e.who} (${e.whoEmail})` : e.who,
				e.subject.label ? `${e.subject.typeLabel} ${e.subject.label}` : e.subject.typeLabel,
				e.sentence,
				e.changes.map(changeText).join('; ')
			])
		);
	}
	const pages = doc.getPages();
	pages.forEach((page, i) =>
		page.drawText(`Page ${i + 1} of ${pages.length}`, { x: MARGIN, y: MARGIN / 2, size: 7.5, font })
	);
	return doc.save();
}
