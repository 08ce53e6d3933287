import { describe, expect, it } from 'vitest';
import { PDFDocument, StandardFonts } from 'pdf-lib';
import { formatTick, timeAxis, valueAxis } from '$lib/server/pdf/chart-scale';
import { embedLexend } from '$lib/server/pdf/fonts';
import { A4, MARGIN, Writer } from '$lib/server/pdf/layout';
import { fitTextToFont } from '$lib/server/pdf/text-fit';

describe('text in a PDF font', () => {
	it('keeps what Lexend draws and spells what it lacks', async () => {
		const { font } = await embedLexend(await PDFDocument.create());
		// Greek μ is not in any Lexend subset; the micro sign µ (U+00B5) is, and reads the same.
		expect(fitTextToFont(font, 'μset 0.15 /h')).toBe('\u00b5set 0.15 /h');
		expect(fitTextToFont(font, 'mmol/(L·h), m², m³, ± 2, 30 °C, 1–2, 2 × 3')).toBe(
			'mmol/(L·h), m², m³, ± 2, 30 °C, 1–2, 2 × 3'
		);
		expect(fitTextToFont(font, 'pH ≤ 7 ≥ 6 → O₂')).toBe('pH <= 7 >= 6 -> O2');
		expect(fitTextToFont(font, 'line one\nline two')).toBe('line one line two');
		expect(fitTextToFont(font, '✓')).toBe('?');
	});

	it('does the same for the standard fonts, which speak WinAnsi only', async () => {
		const font = await (await PDFDocument.create()).embedFont(StandardFonts.Helvetica);
		expect(fitTextToFont(font, 'μ − ≤ →')).toBe('\u00b5 - <= ->');
	});
});

describe('the writer', () => {
	it('moves a heading to the next page rather than leave it at the foot without its content', async () => {
		const doc = await PDFDocument.create();
		const { font, bold } = await embedLexend(doc);
		const w = new Writer(doc, font, bold);
		// Room for the heading itself, but not for the three lines it is kept with.
		w.y = MARGIN + 30;
		w.heading('A section');
		expect(doc.getPageCount()).toBe(2);
		expect(w.y).toBeLessThan(A4[1] - MARGIN);
		expect(w.y).toBeGreaterThan(A4[1] - MARGIN - 20);
	});

	it('keeps a heading on the page when its content fits below it', async () => {
		const doc = await PDFDocument.create();
		const { font, bold } = await embedLexend(doc);
		const w = new Writer(doc, font, bold);
		w.y = MARGIN + 80;
		w.heading('A section');
		expect(doc.getPageCount()).toBe(1);
	});
});

describe('chart axes', () => {
	it('ends the time axis at the run’s end, labelling the end when it is not crowded', () => {
		expect(timeAxis(60)).toEqual({ endValue: 60, step: 10, ticks: [0, 10, 20, 30, 40, 50, 60] });
		// 42 h: ticks every 10 h; the end, 2 h past the last tick, would crowd it.
		expect(timeAxis(42).ticks).toEqual([0, 10, 20, 30, 40]);
		expect(timeAxis(42).endValue).toBe(42);
		// 36 h: ticks every 10 h (36/6 = 6, the next nice step); 36 is 6 h past 30, so it is labelled.
		expect(timeAxis(36).ticks).toEqual([0, 10, 20, 30, 36]);
	});

	it('runs a value axis from 0 to a round number above the largest value', () => {
		expect(valueAxis(69.5)).toEqual({ endValue: 80, step: 20, ticks: [0, 20, 40, 60, 80] });
		// 25 exactly would put a line on the plot's top edge: the axis goes on to the next tick.
		expect(valueAxis(25).endValue).toBe(30);
		expect(valueAxis(0).endValue).toBe(1);
		expect(valueAxis(Number.NaN).endValue).toBe(1);
	});

	it('labels ticks with no more decimals than they need', () => {
		expect([0, 2.5, 5, 7.5].map((t) => formatTick(t, 2.5))).toEqual(['0', '2.5', '5', '7.5']);
		expect(formatTick(0.1 + 0.2, 0.1)).toBe('0.3');
		expect(formatTick(42.5, 10)).toBe('42.5');
	});
});
