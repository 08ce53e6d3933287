import { rgb, type PDFDocument, type PDFFont } from 'pdf-lib';
import { fitTextToFont } from './text-fit';
import { A4, MARGIN } from './layout';

const FOOTER_PT = 8;
const FOOTER_GREY = rgb(0.3, 0.3, 0.3);
const FOOTER_GAP_PT = 14;

/** `text` cut at a word with an ellipsis so that it is at most `widthPt` wide. */
function shortenToWidth(font: PDFFont, text: string, widthPt: number): string {
	if (font.widthOfTextAtSize(text, FOOTER_PT) <= widthPt) return text;
	const words = text.split(' ');
	while (words.length > 1) {
		words.pop();
		const shortened = `${words.join(' ')}…`;
		if (font.widthOfTextAtSize(shortened, FOOTER_PT) <= widthPt) return shortened;
	}
	return '…';
}

/**
 * On every page, in the bottom margin: what the document is at the left, an optional line in the
 * middle (moved right, never over the left text, when that is long), and "Page x of y" at the right.
 * Call once all pages exist.
 */
export function stampPageFooters(
	doc: PDFDocument,
	font: PDFFont,
	parts: { left: string; middle?: string }
): void {
	const pages = doc.getPages();
	const y = MARGIN / 2;
	const widthOf = (text: string) => font.widthOfTextAtSize(text, FOOTER_PT);
	const middle = parts.middle ? fitTextToFont(font, parts.middle) : '';
	const pageWidestPt = widthOf(`Page ${pages.length} of ${pages.length}`);
	const rightEdge = A4[0] - MARGIN;
	const middleRoomPt = middle ? widthOf(middle) + FOOTER_GAP_PT : 0;
	const left = shortenToWidth(
		font,
		fitTextToFont(font, parts.left),
		rightEdge - pageWidestPt - FOOTER_GAP_PT - middleRoomPt - MARGIN
	);
	const middleX = Math.max((A4[0] - widthOf(middle)) / 2, MARGIN + widthOf(left) + FOOTER_GAP_PT);
	pages.forEach((page, i) => {
		const right = `Page ${i + 1} of ${pages.length}`;
		const draw = (text: string, x: number) =>
			page.drawText(text, { x, y, size: FOOTER_PT, font, color: FOOTER_GREY });
		draw(left, MARGIN);
		if (middle) draw(middle, middleX);
		draw(right, rightEdge - widthOf(right));
	});
}
