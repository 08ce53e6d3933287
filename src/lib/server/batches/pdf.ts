import { PDFDocument, StandardFonts } from 'pdf-lib';
import QRCode from 'qrcode';
import { BATCH_STATE_LABELS } from '$lib/batches';
import { batchVolumeL } from '$lib/quantities';
import { A4, MARGIN, Writer } from '../pdf/layout';
import type { BatchView } from './view';

type SheetLine = BatchView['lines'][number];

async function drawRecordQr(doc: PDFDocument, w: Writer, recordUrl: string): Promise<void> {
	const qr = await doc.embedPng(
		await QRCode.toBuffer(recordUrl, {
			type: 'png',
			margin: 1,
			width: 240,
			errorCorrectionLevel: 'M'
		})
	);
	w.page.drawImage(qr, { x: A4[0] - MARGIN - 96, y: A4[1] - MARGIN - 96, width: 96, height: 96 });
}

function writeHeading(w: Writer, view: BatchView): void {
	const b = view.batch;
	w.text(`Batch sheet ${b.number}`, { size: 18, bold: true });
	w.text(`${view.recipe.name}, version ${view.version.n} · ${BATCH_STATE_LABELS[b.state]}`, {
		size: 11
	});
	w.text(
		`Target volume ${batchVolumeL(b.targetVolumeMl)} L · planned ${b.plannedOn} · for ${b.intendedUse}`
	);
	w.text(`Record: ${view.recordUrl}`, { size: 8 });
	w.gap(40);
}

function writeCautions(w: Writer, view: BatchView): void {
	if (!view.cautions.length) return;
	w.text('Cautions (follow the site procedures and the supplier SDS)', {
		bold: true,
		color: [0.6, 0.1, 0.1]
	});
	for (const c of view.cautions)
		w.text(`${c.code}: ${c.text}${c.components.length ? ` (${c.components.join(', ')})` : ''}`, {
			x: MARGIN + 8
		});
	w.gap();
}

function writeLine(w: Writer, line: SheetLine): void {
	w.ensure(40);
	const lotText =
		line.kind === 'stock'
			? `stock: ${line.stockSource || '________'}`
			: line.chosen
				? `lot ${line.chosen.code}`
				: line.suggestion
					? `suggested lot ${line.suggestion.code} (FEFO)`
					: 'no usable lot';
	w.text(
		`${line.position}. ${line.name} — ${line.requiredText} ± ${line.tolerancePercent} % — ${lotText}`,
		{ bold: true }
	);
	if (line.basisName)
		w.text(`Given as ${line.amount} ${line.unit} of ${line.basisName}`, {
			x: MARGIN + 12,
			size: 8.5
		});
	else w.text(`${line.amount} ${line.unit}`, { x: MARGIN + 12, size: 8.5 });
	for (const step of line.steps) w.text(step, { x: MARGIN + 12, size: 8.5 });
	if (line.note) w.text(line.note, { x: MARGIN + 12, size: 8.5 });
	w.text(
		`Actual: ${line.actualText ?? '__________'}   Done by: ${line.doneByName ?? '__________'}${line.consumedText !== null ? `   Taken: ${line.consumedText}` : ''}`,
		{ x: MARGIN + 12, size: 8.5 }
	);
	w.gap(3);
}

function writeFinishing(w: Writer, view: BatchView): void {
	const b = view.batch;
	w.text(`Make up to ${batchVolumeL(b.targetVolumeMl)} L with purified water.`, { bold: true });
	const v = view.version;
	if (v.phRange)
		w.text(
			`pH: target ${v.targetPh} (accept ${v.phRange.min}–${v.phRange.max}, common practice). Measured: ${b.measuredPh ?? '______'}`
		);
	if (v.osmolalityMinMOsmPerKg !== null || v.osmolalityMaxMOsmPerKg !== null) {
		w.text(
			`Osmolality: ${v.osmolalityMinMOsmPerKg ?? '…'}–${v.osmolalityMaxMOsmPerKg ?? '…'} mOsm/kg. Measured: ${b.measuredOsmolality ?? '______'}`
		);
	}
	if (v.instructions) {
		w.gap();
		w.text('Instructions', { bold: true });
		w.text(v.instructions);
	}
}

function writeDeviationsAndSignatures(w: Writer, view: BatchView): void {
	if (view.deviations.length) {
		w.gap();
		w.text('Deviations', { bold: true, color: [0.6, 0.1, 0.1] });
		for (const d of view.deviations) w.text(`${d.detail} Reason: ${d.reason} (${d.by})`);
	}
	if (view.signatures.length) {
		w.gap();
		w.text('Signatures', { bold: true });
		for (const s of view.signatures)
			w.text(
				`${s.signerName} (${s.signerEmail}): ${s.meaning}, ${s.signedAt.toISOString()}${s.comment ? ` — ${s.comment}` : ''}`
			);
	}
}

/** The batch sheet as a PDF: the same content as the printed page, with the record's QR code. */
export async function buildBatchSheetPdf(view: BatchView): Promise<Uint8Array> {
	const doc = await PDFDocument.create();
	doc.setTitle(`Batch sheet ${view.batch.number}`);
	doc.setCreator('Brothwright');
	const font = await doc.embedFont(StandardFonts.Helvetica);
	const bold = await doc.embedFont(StandardFonts.HelveticaBold);
	const w = new Writer(doc, font, bold);
	await drawRecordQr(doc, w, view.recordUrl);
	writeHeading(w, view);
	writeCautions(w, view);
	w.text('Order of addition', { bold: true, size: 11 });
	for (const line of view.lines) writeLine(w, line);
	w.gap();
	writeFinishing(w, view);
	writeDeviationsAndSignatures(w, view);
	return doc.save();
}
