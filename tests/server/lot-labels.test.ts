import { describe, expect, it } from 'vitest';
import { withoutSourceNotes } from '$lib/server/inventory/labels';
import {
	DEFAULT_LABEL_SIZE,
	LABEL_PAGE_MARGIN_MM,
	LABEL_SIZE_IDS,
	LABEL_SIZES,
	labelSizeFrom
} from '$lib/lot-labels';

// ISO 216: A4 is 210 mm × 297 mm.
const A4_WIDTH_MM = 210;
const A4_HEIGHT_MM = 297;

describe('label text', () => {
	it('takes source notes in brackets out and keeps every other bracket', () => {
		expect(withoutSourceNotes('Room temperature, dry, container closed (common practice)')).toBe(
			'Room temperature, dry, container closed'
		);
		expect(withoutSourceNotes('2–8 °C (from memory; supplier sheet) , dark')).toBe('2–8 °C , dark');
		expect(withoutSourceNotes('Keep cold (Common Practice) and dry')).toBe('Keep cold and dry');
		expect(withoutSourceNotes('Manganese(II) sulfate monohydrate')).toBe(
			'Manganese(II) sulfate monohydrate'
		);
		expect(withoutSourceNotes('Soy peptone (papaic digest of soybean meal)')).toBe(
			'Soy peptone (papaic digest of soybean meal)'
		);
		expect(withoutSourceNotes('(common practice)')).toBe('');
	});
});

describe('label sizes', () => {
	it('tile the width of A4 portrait exactly inside the page margins, and a whole row fits its height', () => {
		const widthMm = A4_WIDTH_MM - 2 * LABEL_PAGE_MARGIN_MM;
		const heightMm = A4_HEIGHT_MM - 2 * LABEL_PAGE_MARGIN_MM;
		for (const id of LABEL_SIZE_IDS) {
			const size = LABEL_SIZES[id];
			expect(size.columns * size.widthMm + (size.columns - 1) * size.columnGapMm, id).toBe(widthMm);
			expect(size.heightMm, id).toBeLessThanOrEqual(heightMm);
		}
		expect(LABEL_SIZES.standard.heightMm).toBe(45);
		expect(LABEL_SIZES.small.heightMm).toBe(25);
		expect(LABEL_SIZES.large.heightMm).toBe(70);
	});

	it('reads the size from the address, and anything else as the standard size', () => {
		expect(labelSizeFrom('small').id).toBe('small');
		expect(labelSizeFrom('large').id).toBe('large');
		expect(labelSizeFrom(null).id).toBe(DEFAULT_LABEL_SIZE);
		expect(labelSizeFrom('LARGE').id).toBe(DEFAULT_LABEL_SIZE);
		expect(labelSizeFrom('toString').id).toBe(DEFAULT_LABEL_SIZE);
	});
});
