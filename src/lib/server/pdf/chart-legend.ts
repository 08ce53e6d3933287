import { rgb, type PDFFont, type PDFPage } from 'pdf-lib';
import type { LineStyle, Rgb } from './line-chart';
import { fitTextToFont } from './text-fit';

/** A legend entry: a sample of its line, or a filled swatch for a shaded band. */
export interface LegendEntry {
	label: string;
	style?: LineStyle;
	swatch?: Rgb;
}

interface PlacedEntry {
	entry: LegendEntry;
	text: string;
	dx: number;
}

const LEGEND_PT = 7.5;
export const LEGEND_ROW_PT = LEGEND_PT + 4;
const SAMPLE_PT = 22;
const SAMPLE_GAP_PT = 4;
const ENTRY_GAP_PT = 12;

/** The entries in rows that fit `widthPt`, each with its offset from the left. */
export function layLegend(font: PDFFont, entries: LegendEntry[], widthPt: number): PlacedEntry[][] {
	const rows: PlacedEntry[][] = [];
	let row: PlacedEntry[] = [];
	let dx = 0;
	for (const entry of entries) {
		const text = fitTextToFont(font, entry.label);
		const width = SAMPLE_PT + SAMPLE_GAP_PT + font.widthOfTextAtSize(text, LEGEND_PT);
		if (row.length && dx + width > widthPt) {
			rows.push(row);
			row = [];
			dx = 0;
		}
		row.push({ entry, text, dx });
		dx += width + ENTRY_GAP_PT;
	}
	if (row.length) rows.push(row);
	return rows;
}

function drawSample(page: PDFPage, entry: LegendEntry, x: number, midY: number): void {
	if (entry.swatch) {
		page.drawRectangle({
			x,
			y: midY - 3.5,
			width: SAMPLE_PT,
			height: 7,
			color: rgb(...entry.swatch)
		});
		return;
	}
	const style = entry.style!;
	page.drawLine({
		start: { x, y: midY },
		end: { x: x + SAMPLE_PT, y: midY },
		thickness: style.widthPt ?? 1.2,
		color: rgb(...style.color),
		dashArray: style.dashPt
	});
}

/** Draws the laid-out legend with its first row's top at `top`. */
export function drawLegend(
	page: PDFPage,
	font: PDFFont,
	rows: PlacedEntry[][],
	left: number,
	top: number
): void {
	rows.forEach((row, i) => {
		const baseline = top - (i + 1) * LEGEND_ROW_PT + 3;
		for (const placed of row) {
			const x = left + placed.dx;
			drawSample(page, placed.entry, x, baseline + LEGEND_PT / 3);
			page.drawText(placed.text, {
				x: x + SAMPLE_PT + SAMPLE_GAP_PT,
				y: baseline,
				size: LEGEND_PT,
				font,
				color: rgb(0.15, 0.15, 0.15)
			});
		}
	});
}
