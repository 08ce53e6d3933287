import { PDFDocument } from 'pdf-lib';
import QRCode from 'qrcode';
import { BATCH_STATE_LABELS } from '$lib/batches';
import { formatDateTime } from '$lib/date-time';
import { batchVolumeL } from '$lib/quantities';
import { drawPictogram } from '$lib/hazards/pictogram-pdf';
import { drawGrid, gridLeadHeightPt } from '../pdf/grid';
import { embedLexend } from '../pdf/fonts';
import { A4, MARGIN, Writer } from '../pdf/layout';
import { stampPageFooters } from '../pdf/page-footer';
import { SHEET_COLUMNS, sheetRows, signatureRows } from './sheet-table';
import type { BatchView } from './view';

const QR_PT = 96;

async function drawRecordQr(doc: PDFDocument, w: Writer, recordUrl: string): Promise<void> {
	const qr = await doc.embedPng(
		await QRCode.toBuffer(recordUrl, {
			type: 'png',
			margin: 1,
			width: 240,
			errorCorrectionLevel: 'M'
		})
	);
	w.page.drawImage(qr, {
		x: A4[0] - MARGIN - QR_PT,
		y: A4[1] - MARGIN - QR_PT,
		width: QR_PT,
		height: QR_PT
	});
}

function writeHeading(w: Writer, view: BatchView): void {
	const b = view.batch;
	const top = w.y;
	w.text(`Batch sheet ${b.number}`, { size: 18, bold: true });
	w.text(`${view.recipe.name}, version ${view.version.n} · ${BATCH_STATE_LABELS[b.state]}`, {
		size: 11
	});
	w.text(
		`Target volume ${batchVolumeL(b.targetVolumeMl)} L · planned ${b.plannedOn} · for ${b.intendedUse}`
	);
	w.text(`Scan the code to open the record: ${view.recordUrl}`, { size: 7.5 });
	w.y = Math.min(w.y, top - QR_PT) - 8;
}

const PICTOGRAM_PT = 20;

/** The preparation's protective equipment, pictograms, fume hood, pH step, and our own notices. */
function writeHandling(w: Writer, view: BatchView): void {
	const p = view.preparation;
	w.heading('Handling');
	const pictograms = [...new Set(Object.values(p.lines).flatMap((set) => set.pictograms))];
	if (pictograms.length) {
		w.ensure(PICTOGRAM_PT + 4);
		pictograms.forEach((id, i) =>
			drawPictogram(w.page, id, {
				x: MARGIN + i * (PICTOGRAM_PT + 3),
				y: w.y - PICTOGRAM_PT - 1,
				sizePt: PICTOGRAM_PT
			})
		);
		w.gap(PICTOGRAM_PT + 4);
	}
	w.text(
		p.ppe.length
			? `Wear or use: ${p.ppe.map((item) => item.text).join('; ')}.`
			: 'No GHS hazard in the steps of this preparation.',
		{ size: 9 }
	);
	if (p.fumeHood.length) w.text(`Fume hood for: ${p.fumeHood.join(', ')}.`, { size: 9 });
	for (const agent of p.ph?.agents ?? []) {
		const statements = agent.hazards.statements.map((s) => `${s.code} ${s.text}`).join('; ');
		w.text(
			`pH step: ${agent.name}, ${agent.workingSolution}${agent.hazards.signalWord ? ` - ${agent.hazards.signalWord}` : ''}${statements ? `: ${statements}` : ''}.`,
			{ size: 9 }
		);
	}
	if (p.ph?.unnamed) w.text(`pH step: ${p.ph.unnamed}`, { size: 9 });
	for (const notice of p.notices) w.text(`Take care: ${notice.text}`, { size: 9, bold: true });
	w.text('A reminder only: follow your site’s procedures and the supplier’s safety data sheet.', {
		size: 7.5
	});
	w.gap(6);
}

function writeFinishing(w: Writer, view: BatchView): void {
	const b = view.batch;
	w.ensure(60);
	w.text(`Make up to ${batchVolumeL(b.targetVolumeMl)} L with purified water.`, { bold: true });
	const v = view.version;
	if (v.phRange)
		w.text(
			`pH: target ${v.targetPh} (accept ${v.phRange.min}–${v.phRange.max}, common practice). Measured: ${b.measuredPh ?? '________'}`
		);
	if (v.osmolalityMinMOsmPerKg !== null || v.osmolalityMaxMOsmPerKg !== null)
		w.text(
			`Osmolality: ${v.osmolalityMinMOsmPerKg ?? '…'}–${v.osmolalityMaxMOsmPerKg ?? '…'} mOsm/kg. Measured: ${b.measuredOsmolality ?? '________'} mOsm/kg`
		);
	const finished = view.preparation.finished.statements;
	w.text(
		finished.length
			? `The finished solution carries: ${finished.map((s) => `${s.code} ${s.text}`).join('; ')}.`
			: 'The finished solution carries no GHS statement at its concentrations.',
		{ size: 8.5 }
	);
	if (v.instructions) {
		w.gap();
		w.heading('Instructions', { size: 9.5 });
		w.text(v.instructions);
	}
	w.gap(8);
}

function writeDeviations(w: Writer, view: BatchView): void {
	if (!view.deviations.length) return;
	w.heading('Deviations', { size: 9.5, color: [0.6, 0.1, 0.1] });
	for (const d of view.deviations) w.text(`${d.detail} Reason: ${d.reason} (${d.by})`);
	w.gap(8);
}

function writeSignatures(w: Writer, view: BatchView, timeZone: string): void {
	w.ensure(90);
	w.text('Signatures', { bold: true, size: 11 });
	w.gap(2);
	drawGrid(
		w,
		[
			{ header: 'Role', widthPt: 80 },
			{ header: 'Name', widthPt: 150 },
			{ header: 'Signature', widthPt: 150 },
			{ header: 'Date and time', widthPt: 135 }
		],
		signatureRows(view, timeZone).map((s) => [
			{ text: s.role },
			s.name ? { text: s.name } : { text: '', blank: true },
			s.meaning ? { text: `signed electronically: ${s.meaning}` } : { text: '', blank: true },
			s.at ? { text: s.at } : { text: '', blank: true }
		])
	);
}

/**
 * The batch sheet as a PDF: the printed page's table (sheet-table.ts) ruled for filling in by hand,
 * with the record's QR code, a signature block and the batch number and page on every page.
 */
export async function buildBatchSheetPdf(
	view: BatchView,
	timeZone: string,
	printedAt = new Date()
): Promise<Uint8Array> {
	const doc = await PDFDocument.create();
	doc.setTitle(`Batch sheet ${view.batch.number}`);
	doc.setCreator('Brothwright');
	const { font, bold } = await embedLexend(doc);
	const w = new Writer(doc, font, bold);
	await drawRecordQr(doc, w, view.recordUrl);
	writeHeading(w, view);
	writeHandling(w, view);
	const columns = SHEET_COLUMNS.map((c) => ({ header: c.header, widthPt: c.widthPt }));
	const rows = sheetRows(view, timeZone).map((row) => SHEET_COLUMNS.map((c) => row[c.key]));
	w.heading('Order of addition', { keepWithNextPt: 2 + gridLeadHeightPt(w, columns, rows) });
	w.gap(2);
	drawGrid(w, columns, rows);
	writeFinishing(w, view);
	writeDeviations(w, view);
	writeSignatures(w, view, timeZone);
	stampPageFooters(doc, font, {
		left: `Batch sheet ${view.batch.number} · ${view.recipe.name} v${view.version.n}`,
		middle: `Printed ${formatDateTime(printedAt, timeZone)}`
	});
	return doc.save();
}
