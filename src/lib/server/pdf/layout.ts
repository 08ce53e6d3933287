import { rgb, type PDFDocument, type PDFFont, type PDFPage } from 'pdf-lib';

// The standard PDF fonts speak WinAnsi only; map what they cannot draw to plain equivalents.
const REPLACEMENTS: Record<string, string> = {
	'−': '-',
	'→': '->',
	'≤': '<=',
	'≥': '>=',
	'·': '·',
	'₂': '2',
	'₃': '3',
	'₄': '4',
	'⁺': '+',
	'⁻': '-',
	µ: 'µ',
	'…': '...',
	'“': '"',
	'”': '"',
	'‘': "'",
	'’': "'",
	'–': '-',
	'—': '-'
};
export function toWinAnsi(text: string): string {
	return [...text]
		.map((c) => REPLACEMENTS[c] ?? c)
		.join('')
		.replace(/[^\x20-\x7e\xa0-\xff]/g, '?');
}

export const A4: [number, number] = [595.28, 841.89];
export const MARGIN = 40;

export interface TableColumn {
	header: string;
	width: number;
	align?: 'left' | 'right';
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
	text(
		text: string,
		options: { size?: number; bold?: boolean; x?: number; color?: [number, number, number] } = {}
	) {
		const size = options.size ?? 9.5;
		const font = options.bold ? this.bold : this.font;
		const maxWidth = A4[0] - MARGIN - (options.x ?? MARGIN);
		for (const line of this.wrap(toWinAnsi(text), font, size, maxWidth)) {
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
			cells.map((cell, i) => this.wrap(toWinAnsi(cell), font, size, columns[i].width - 4));
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
	wrap(text: string, font: PDFFont, size: number, maxWidth: number): string[] {
		const words = text.split(/\s+/);
		const lines: string[] = [];
		let current = '';
		for (const word of words) {
			const next = current ? `${current} ${word}` : word;
			if (font.widthOfTextAtSize(next, size) > maxWidth && current) {
				lines.push(current);
				current = word;
			} else current = next;
		}
		if (current) lines.push(current);
		return lines.length ? lines : [''];
	}
}
