import { execFileSync } from 'node:child_process';
import { readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { PNG } from 'pngjs';

/** A PDF as a person reads it: each page's text in layout order (poppler's pdftotext). */
export function pdfPageTexts(pdfPath: string): string[] {
	const text = execFileSync('pdftotext', ['-layout', pdfPath, '-'], { encoding: 'utf8' });
	return text.split('\f').filter((page) => page.trim() !== '');
}

/** Every page drawn to PNG at `dpi` by poppler's pdftoppm, in page order. */
export function renderPdfPages(pdfPath: string, folder: string, dpi = 100): string[] {
	execFileSync('pdftoppm', ['-r', String(dpi), '-png', pdfPath, join(folder, 'page')]);
	return readdirSync(folder)
		.filter((name) => /^page-\d+\.png$/.test(name))
		.sort()
		.map((name) => join(folder, name));
}

export function readPng(path: string): PNG {
	return PNG.sync.read(readFileSync(path));
}

export function writePdf(path: string, bytes: Buffer): string {
	writeFileSync(path, bytes);
	return path;
}

/**
 * Rows of the picture crossed by a dark horizontal rule at least `minWidthPx` long: the ruled lines
 * of a table. Neighbouring rows of one rule count once.
 */
export function horizontalRules(png: PNG, minWidthPx: number): number[] {
	const rules: number[] = [];
	for (let y = 0; y < png.height; y++) {
		let run = 0;
		let longest = 0;
		for (let x = 0; x < png.width; x++) {
			const i = (y * png.width + x) * 4;
			const dark = png.data[i] < 140 && png.data[i + 1] < 140 && png.data[i + 2] < 140;
			run = dark ? run + 1 : 0;
			longest = Math.max(longest, run);
		}
		if (longest >= minWidthPx && rules.at(-1) !== y - 1) rules.push(y);
		else if (longest >= minWidthPx) rules[rules.length - 1] = y;
	}
	return rules;
}
