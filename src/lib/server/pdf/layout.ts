import { rgb, type PDFDocument, type PDFFont, type PDFPage } from 'pdf-lib';
import { fitTextToFont } from './text-fit';

export const A4: [number, number] = [595.28, 841.89];
export const MARGIN = 40;

/** Room kept below a heading for the start of its content: three lines of body text. */
const KEEP_WITH_HEADING_PT = 3 * (9.5 + 3);

export interface TextOptions {
	size?: number;
	bold?: boolean;
	x?: number;
	color?: [number, number, number];
}

export interface TableColumn {
	header: string;
	width: number;
	align?: 'left' | 'right';
}

const wordWidths = new WeakMap<PDFFont, Map<string, number>>();

/**
 * A word's width at 1 pt, measured once per font: a custom font lays text out glyph by glyph, too
 * slowly to measure every trial line while wrapping. A line is as wide as its words and spaces.
 */
function widthOfWord(font: PDFFont, word: string): number {
	let widths = wordWidths.get(font);
	if (!widths) wordWidths.set(font, (widths = new Map()));
	let width = widths.get(word);
	if (width === undefined) widths.set(word, (width = font.widthOfTextAtSize(word, 1)));
	return width;
}

/** A top-down writer on A4 pages that starts a new page when the next block would not fit. */
export class Writer {
	page: PDFPage;
	y: number;
	constructor(
		readonly doc: PDFDocument,
		readonly font: PDFFont,
		readonly bold: PDFFont
	) {
		this.page = doc.addPage(A4);
		this.y = A4[1] - MARGIN;
	}
	ensure(height: number) {
		if (this.y - height < MARGIN) this.newPage();
	}
	newPage() {
		this.page = this.doc.addPage(A4);
		this.y = A4[1] - MARGIN;
	}
	/** `text` as `font` can draw it (text-fit.ts): symbols it lacks spelled, never a blank box. */
	fit(text: string, font: PDFFont = this.font): string {
		return fitTextToFont(font, text);
	}
	/** The lines `text` wraps to, as `text` would draw them. */
	lines(text: string, options: TextOptions = {}): string[] {
		const size = options.size ?? 9.5;
		const font = options.bold ? this.bold : this.font;
		const maxWidth = A4[0] - MARGIN - (options.x ?? MARGIN);
		return this.wrap(this.fit(text, font), font, size, maxWidth);
	}
	/**
	 * A bold heading kept with the start of what follows it: when fewer than `keepWithNextPt` points
	 * would remain below it, it starts the next page instead of ending this one.
	 */
	heading(text: string, options: TextOptions & { keepWithNextPt?: number } = {}) {
		const size = options.size ?? 11;
		const height = this.lines(text, { ...options, size, bold: true }).length * (size + 3);
		this.ensure(height + (options.keepWithNextPt ?? KEEP_WITH_HEADING_PT));
		this.text(text, { ...options, size, bold: true });
	}
	text(text: string, options: TextOptions = {}) {
		const size = options.size ?? 9.5;
		const font = options.bold ? this.bold : this.font;
		for (const line of this.lines(text, options)) {
			this.ensure(size + 3);
			this.page.drawText(line, {
				x: options.x ?? MARGIN,
				y: this.y - size,
				size,
				font,
				color: options.color ? rgb(...options.color) : rgb(0, 0, 0)
			});
			this.y -= size + 3;
		}
	}
	gap(points = 6) {
		this.y -= points;
	}
	/** A plain text table; a row is never split across pages, and the header repeats on each new page. */
	table(columns: TableColumn[], rows: string[][], options: { size?: number } = {}) {
		const size = options.size ?? 8.5;
		const lineHeight = size + 3;
		const cellLines = (cells: string[], font: PDFFont) =>
			this.cellLines(columns, cells, font, size);
		const header = cellLines(
			columns.map((c) => c.header),
			this.bold
		);
		const headerHeight = Math.max(...header.map((l) => l.length)) * lineHeight;
		const drawRow = (lines: string[][], font: PDFFont) => {
			let x = MARGIN;
			lines.forEach((cell, i) => {
				const column = columns[i];
				cell.forEach((line, n) => {
					const lineX =
						column.align === 'right'
							? x + column.width - 4 - font.widthOfTextAtSize(line, size)
							: x;
					this.page.drawText(line, {
						x: lineX,
						y: this.y - size - n * lineHeight,
						size,
						font,
						color: rgb(0, 0, 0)
					});
				});
				x += column.width;
			});
			this.y -= Math.max(...lines.map((l) => l.length)) * lineHeight;
		};
		const drawHeader = () => {
			drawRow(header, this.bold);
			this.page.drawLine({
				start: { x: MARGIN, y: this.y + 1 },
				end: { x: MARGIN + columns.reduce((s, c) => s + c.width, 0), y: this.y + 1 },
				thickness: 0.5,
				color: rgb(0.5, 0.5, 0.5)
			});
			this.y -= 2;
		};
		this.ensure(headerHeight + lineHeight + 2);
		drawHeader();
		for (const row of rows) {
			const lines = cellLines(row, this.font);
			const height = Math.max(...lines.map((l) => l.length)) * lineHeight;
			if (this.y - height < MARGIN) {
				this.newPage();
				drawHeader();
			}
			drawRow(lines, this.font);
		}
	}
	private cellLines(columns: TableColumn[], cells: string[], font: PDFFont, size: number) {
		return cells.map((cell, i) =>
			this.wrap(this.fit(cell, font), font, size, columns[i].width - 4)
		);
	}
	/** The height of a table's header and first row: what a heading above it must be kept with. */
	tableLeadPt(columns: TableColumn[], rows: string[][], options: { size?: number } = {}): number {
		const size = options.size ?? 8.5;
		const heightOf = (cells: string[], font: PDFFont) =>
			Math.max(...this.cellLines(columns, cells, font, size).map((l) => l.length)) * (size + 3);
		const header = heightOf(
			columns.map((c) => c.header),
			this.bold
		);
		return header + 2 + (rows[0] ? heightOf(rows[0], this.font) : 0);
	}
	wrap(text: string, font: PDFFont, size: number, maxWidth: number): string[] {
		const spaceWidth = widthOfWord(font, ' ') * size;
		const lines: string[] = [];
		let current = '';
		let currentWidth = 0;
		for (const word of text.split(/\s+/)) {
			const wordWidth = widthOfWord(font, word) * size;
			const nextWidth = current ? currentWidth + spaceWidth + wordWidth : wordWidth;
			if (nextWidth > maxWidth && current) {
				lines.push(current);
				current = word;
				currentWidth = wordWidth;
			} else {
				current = current ? `${current} ${word}` : word;
				currentWidth = nextWidth;
			}
		}
		if (current) lines.push(current);
		return lines.length ? lines : [''];
	}
}
