import { rgb } from 'pdf-lib';
import type { PictogramId } from '$chemistry';
import { drawPictogram } from '$lib/hazards/pictogram-pdf';
import { MARGIN, type Writer } from './layout';

export interface GridColumn {
	header: string;
	widthPt: number;
}

/** A cell: bold main text, smaller detail lines, or a blank with a line to write on. */
export interface GridCell {
	text: string;
	detail?: string[];
	pictograms?: PictogramId[];
	blank?: boolean;
}

const TEXT_PT = 8.5;
const DETAIL_PT = 7;
const PAD_PT = 3;
/** A blank cell is tall enough to write in by hand (about 7 mm). */
const BLANK_ROW_PT = 20;
/** GHS pictograms in a cell: about 6 mm, large enough to tell apart on paper. */
const PICTOGRAM_PT = 17;
const RULE = rgb(0.35, 0.35, 0.35);

interface LaidCell {
	main: string[];
	detail: string[];
	pictograms: PictogramId[];
	blank: boolean;
}

function layCell(w: Writer, cell: GridCell, widthPt: number, bold: boolean): LaidCell {
	const inner = widthPt - 2 * PAD_PT;
	const mainFont = bold ? w.bold : w.font;
	return {
		main: cell.text ? w.wrap(w.fit(cell.text, mainFont), mainFont, TEXT_PT, inner) : [],
		detail: (cell.detail ?? []).flatMap((d) => w.wrap(w.fit(d), w.font, DETAIL_PT, inner)),
		pictograms: cell.pictograms ?? [],
		blank: Boolean(cell.blank)
	};
}

function cellHeight(cell: LaidCell): number {
	const text =
		cell.main.length * (TEXT_PT + 2) +
		cell.detail.length * (DETAIL_PT + 2) +
		(cell.pictograms.length ? PICTOGRAM_PT + 2 : 0);
	return Math.max(cell.blank ? BLANK_ROW_PT : 0, text + 2 * PAD_PT);
}

function drawCell(
	w: Writer,
	cell: LaidCell,
	x: number,
	top: number,
	widthPt: number,
	height: number
) {
	let y = top - PAD_PT;
	for (const line of cell.main) {
		w.page.drawText(line, { x: x + PAD_PT, y: y - TEXT_PT, size: TEXT_PT, font: w.bold });
		y -= TEXT_PT + 2;
	}
	for (const line of cell.detail) {
		w.page.drawText(line, {
			x: x + PAD_PT,
			y: y - DETAIL_PT,
			size: DETAIL_PT,
			font: w.font,
			color: rgb(0.25, 0.25, 0.25)
		});
		y -= DETAIL_PT + 2;
	}
	cell.pictograms.forEach((id, i) =>
		drawPictogram(w.page, id, {
			x: x + PAD_PT + i * (PICTOGRAM_PT + 2),
			y: y - PICTOGRAM_PT - 1,
			sizePt: PICTOGRAM_PT
		})
	);
	if (cell.blank)
		w.page.drawLine({
			start: { x: x + PAD_PT, y: top - height + 5 },
			end: { x: x + widthPt - PAD_PT, y: top - height + 5 },
			thickness: 0.4,
			color: rgb(0.6, 0.6, 0.6)
		});
}

function drawRow(w: Writer, columns: GridColumn[], cells: LaidCell[], height: number): void {
	const top = w.y;
	let x = MARGIN;
	columns.forEach((column, i) => {
		w.page.drawRectangle({
			x,
			y: top - height,
			width: column.widthPt,
			height,
			borderColor: RULE,
			borderWidth: 0.5
		});
		drawCell(w, cells[i], x, top, column.widthPt, height);
		x += column.widthPt;
	});
	w.y -= height;
}

function layHeader(w: Writer, columns: GridColumn[]): LaidCell[] {
	return columns.map((c) => layCell(w, { text: c.header }, c.widthPt, true));
}

function layRow(w: Writer, columns: GridColumn[], row: GridCell[]): LaidCell[] {
	return row.map((cell, i) => layCell(w, cell, columns[i].widthPt, true));
}

/** The height of the grid's header and first row: what a heading above it must be kept with. */
export function gridLeadHeightPt(w: Writer, columns: GridColumn[], rows: GridCell[][]): number {
	const header = Math.max(...layHeader(w, columns).map(cellHeight));
	return header + (rows[0] ? Math.max(...layRow(w, columns, rows[0]).map(cellHeight)) : 0);
}

/**
 * A ruled table: every cell boxed, the header row repeated on each new page, and a row never split
 * across pages, so each line of a sheet can be filled in and initialled on paper.
 */
export function drawGrid(w: Writer, columns: GridColumn[], rows: GridCell[][]): void {
	const header = layHeader(w, columns);
	const headerHeight = Math.max(...header.map(cellHeight));
	const drawHeader = () => {
		const top = w.y;
		w.page.drawRectangle({
			x: MARGIN,
			y: top - headerHeight,
			width: columns.reduce((sum, c) => sum + c.widthPt, 0),
			height: headerHeight,
			color: rgb(0.9, 0.9, 0.9)
		});
		drawRow(w, columns, header, headerHeight);
	};
	const laid = rows.map((row) => layRow(w, columns, row));
	w.ensure(gridLeadHeightPt(w, columns, rows));
	drawHeader();
	for (const cells of laid) {
		const height = Math.max(...cells.map(cellHeight));
		if (w.y - height < MARGIN) {
			w.newPage();
			drawHeader();
		}
		drawRow(w, columns, cells, height);
	}
	w.gap(8);
}
