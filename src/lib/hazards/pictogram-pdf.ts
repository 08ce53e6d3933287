/** Draws a GHS pictogram into a pdf-lib page from the same path data the browser draws. */
import { rgb, type PDFPage } from 'pdf-lib';
import type { PictogramId } from '$chemistry';
import { GHS_PICTOGRAMS, PICTOGRAM_COLOURS } from './ghs-pictograms';

const VIEW_BOX_SIZE = 100;

/**
 * `x`, `y`: the lower-left corner of the pictogram's square in PDF points, as for pdf-lib's
 * other drawing calls. drawSvgPath puts the SVG origin at the point it is given with its y axis
 * pointing down, so the paths start from the square's top edge, `y + sizePt`.
 */
export function drawPictogram(
	page: PDFPage,
	id: PictogramId,
	{ x, y, sizePt }: { x: number; y: number; sizePt: number }
): void {
	const scale = sizePt / VIEW_BOX_SIZE;
	for (const shape of GHS_PICTOGRAMS[id].paths) {
		const [r, g, b] = PICTOGRAM_COLOURS[shape.fill];
		page.drawSvgPath(shape.d, { x, y: y + sizePt, scale, color: rgb(r, g, b) });
	}
}
