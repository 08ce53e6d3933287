import { execFileSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import jsQR from 'jsqr';
import { PNG } from 'pngjs';
import type { Page } from '@playwright/test';

/** CSS pixels per millimetre (96 px per inch), as the browser lays out print. */
export const PX_PER_MM = 96 / 25.4;

export interface Box {
	x: number;
	y: number;
	width: number;
	height: number;
}

export interface LabelLayout {
	code: string;
	/** The label's outline, in CSS px from the sheet's top left corner. */
	outline: Box;
	/** The outline's border width, CSS px. */
	borderPx: number;
	/** Descendants that reach outside the outline or whose content spills out of their own box. */
	outside: string[];
	spilling: string[];
	/** Lines the lot code is set on; 1 when it is not wrapped. */
	codeLines: number;
	codeClipped: boolean;
}

/**
 * Every label's outline and what of it does not stay inside, read from the page as laid out now
 * (call after `emulateMedia({ media: 'print' })`).
 */
export async function readLabelLayout(page: Page): Promise<LabelLayout[]> {
	return page.evaluate(() => {
		const sheet = document.querySelector('[data-testid="label-sheet"]')!.getBoundingClientRect();
		const describe = (el: Element) =>
			`${el.tagName.toLowerCase()}.${[...el.classList].join('.')} “${(el.textContent ?? '').trim().slice(0, 40)}”`;
		return [...document.querySelectorAll<HTMLElement>('[data-testid="lot-label"]')].map((label) => {
			const outline = label.getBoundingClientRect();
			const outside: string[] = [];
			const spilling: string[] = [];
			for (const el of label.querySelectorAll('*')) {
				const r = el.getBoundingClientRect();
				if (r.width === 0 && r.height === 0) continue;
				if (
					r.left < outline.left - 0.5 ||
					r.top < outline.top - 0.5 ||
					r.right > outline.right + 0.5 ||
					r.bottom > outline.bottom + 0.5
				)
					outside.push(describe(el));
				// An element that does not clip must hold its own content; one that clips is the
				// clamp or ellipsis the label means to use.
				if (!(el instanceof HTMLElement) || el.clientWidth === 0) continue;
				const style = getComputedStyle(el);
				if (style.overflowX === 'visible' && el.scrollWidth > el.clientWidth + 1)
					spilling.push(describe(el));
				if (style.overflowY === 'visible' && el.scrollHeight > el.clientHeight + 1)
					spilling.push(describe(el));
			}
			const code = label.querySelector<HTMLElement>('[data-testid="label-code"]')!;
			const codeText = [...code.childNodes].find((n) => n.nodeType === Node.TEXT_NODE)!;
			const range = document.createRange();
			range.selectNodeContents(codeText);
			const lineTops = new Set([...range.getClientRects()].map((r) => Math.round(r.top)));
			return {
				code: label.dataset.lotCode!,
				outline: {
					x: outline.left - sheet.left,
					y: outline.top - sheet.top,
					width: outline.width,
					height: outline.height
				},
				borderPx: parseFloat(getComputedStyle(label).borderLeftWidth),
				outside,
				spilling,
				codeLines: lineTops.size,
				codeClipped: code.scrollWidth > code.clientWidth
			};
		});
	});
}

/** Renders page 1 of a PDF to a PNG at `dpi` with poppler's pdftoppm; returns the PNG's path. */
export function renderFirstPage(pdfPath: string, dpi: number): string {
	const prefix = pdfPath.replace(/\.pdf$/, '');
	execFileSync('pdftoppm', [
		'-r',
		String(dpi),
		'-png',
		'-f',
		'1',
		'-l',
		'1',
		'-singlefile',
		pdfPath,
		prefix
	]);
	return `${prefix}.png`;
}

/** The text poppler's pdftotext reads on page 1 inside a box given in pixels at `dpi`. */
export function pdfTextIn(pdfPath: string, dpi: number, box: Box): string {
	const args = ['-f', '1', '-l', '1', '-r', String(dpi)];
	args.push('-x', String(Math.round(box.x)), '-y', String(Math.round(box.y)));
	args.push('-W', String(Math.round(box.width)), '-H', String(Math.round(box.height)));
	return execFileSync('pdftotext', [...args, pdfPath, '-'], { encoding: 'utf8' });
}

export function readPng(path: string): PNG {
	return PNG.sync.read(readFileSync(path));
}

/** The text of the QR code found inside `box` (image pixels), or null when none is found. */
export function decodeQrIn(png: PNG, box: Box): string | null {
	const x0 = Math.max(0, Math.floor(box.x));
	const y0 = Math.max(0, Math.floor(box.y));
	const width = Math.min(png.width - x0, Math.ceil(box.width));
	const height = Math.min(png.height - y0, Math.ceil(box.height));
	const crop = new Uint8ClampedArray(width * height * 4);
	for (let row = 0; row < height; row++) {
		const start = ((y0 + row) * png.width + x0) * 4;
		crop.set(png.data.subarray(start, start + width * 4), row * width * 4);
	}
	return jsQR(crop, width, height)?.data ?? null;
}

/** The grey level (0 black, 255 white) of one image pixel. */
export function greyAt(png: PNG, x: number, y: number): number {
	const i = (Math.round(y) * png.width + Math.round(x)) * 4;
	return (png.data[i] + png.data[i + 1] + png.data[i + 2]) / 3;
}
