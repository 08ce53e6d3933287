import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { formatReadNumber, readDecimalText, type DecimalMark } from '$lib/number-reading';
import { readAmountText, readGramsText, readQuantityUnit } from '$lib/quantities';

const read = (text: string, mark: DecimalMark = 'point') => readDecimalText(text, 'Quantity', mark);

describe('reading a typed number at a point site (the default)', () => {
	it('reads plain and point-decimal numbers, signs and exponents', () => {
		expect(read('1500')).toEqual({ ok: true, value: 1500 });
		expect(read('1.5')).toEqual({ ok: true, value: 1.5 });
		expect(read('1.500')).toEqual({ ok: true, value: 1.5 });
		expect(read(' -0.25 ')).toEqual({ ok: true, value: -0.25 });
		expect(read('−3')).toEqual({ ok: true, value: -3 });
		expect(read('2e-3')).toEqual({ ok: true, value: 0.002 });
		expect(read('.5')).toEqual({ ok: true, value: 0.5 });
	});

	it('refuses a comma, saying whether it looks like a thousands separator or a decimal comma', () => {
		expect(read('1,500')).toEqual({
			ok: false,
			message:
				'Quantity: “1,500” is ambiguous: it could be 1.5 or 1500. This site writes decimals with a point and no thousands separator: type 1500 or 1.5.'
		});
		expect(read('1,5')).toEqual({
			ok: false,
			message:
				'Quantity: “1,5” has a decimal comma, but this site writes decimals with a point: type 1.5.'
		});
		expect(read('12,345,678.5')).toEqual({
			ok: false,
			message:
				'Quantity: “12,345,678.5” has thousands separators, which are not read (they could be decimal commas): type 12345678.5.'
		});
		expect(read('1 500')).toEqual({
			ok: false,
			message:
				'Quantity: “1 500” has a thousands separator (a space or apostrophe), which is not read: type 1500.'
		});
		expect(read('a lot')).toEqual({ ok: false, message: 'Quantity: “a lot” is not a number.' });
		expect(read("1'500")).toMatchObject({ ok: false });
		expect(read('1.500.000')).toEqual({
			ok: false,
			message: 'Quantity: “1.500.000” is not a number.'
		});
		expect(read('12 g')).toMatchObject({ ok: false });
		expect(read('')).toEqual({ ok: false, message: 'Quantity: enter a number.' });
		expect(read('1e999')).toEqual({
			ok: false,
			message: 'Quantity: “1e999” is too large to be a number.'
		});
	});
});

describe('reading a typed number at a comma site', () => {
	it('reads the decimal comma, and a point where it cannot be a thousands separator', () => {
		expect(read('1,5', 'comma')).toEqual({ ok: true, value: 1.5 });
		expect(read('1500', 'comma')).toEqual({ ok: true, value: 1500 });
		expect(read('1.5', 'comma')).toEqual({ ok: true, value: 1.5 });
		expect(read('1234.5', 'comma')).toEqual({ ok: true, value: 1234.5 });
		expect(read('0.500', 'comma')).toEqual({ ok: true, value: 0.5 });
		expect(read('2,5e-3', 'comma')).toEqual({ ok: true, value: 0.0025 });
		expect(read('1,500', 'comma')).toEqual({ ok: true, value: 1.5 });
	});

	it('refuses a point in thousands-separator position as ambiguous', () => {
		expect(read('1.500', 'comma')).toEqual({
			ok: false,
			message:
				'Quantity: “1.500” is ambiguous: it could be 1,5 or 1500. This site writes decimals with a comma and no thousands separator: type 1500 or 1,5.'
		});
		expect(read('1.234.567,5', 'comma')).toMatchObject({
			ok: false,
			message: expect.stringContaining('thousands separators, which are not read: type 1234567,5')
		});
		expect(read('1,5,5', 'comma')).toMatchObject({ ok: false });
	});
});

// Independent of the reader: JavaScript's own number → text (ECMAScript Number::toString) and the
// grouping of Intl.NumberFormat for en-US (comma groups) and de-DE (point groups).
const finiteNumbers = fc.double({ noNaN: true, noDefaultInfinity: true });

describe('properties of the reader', () => {
	it('reads back every number the app writes, at either site', () => {
		fc.assert(
			fc.property(finiteNumbers, (x) => {
				// String(-0) is "0": compare with ===, which holds -0 and 0 equal.
				const pointRead = read(String(x));
				expect(pointRead.ok && pointRead.value === x).toBe(true);
				const commaRead = read(formatReadNumber(x, 'comma'), 'comma');
				expect(commaRead.ok && commaRead.value === x).toBe(true);
			})
		);
	});

	it('refuses every grouped thousand, at either site, and never guesses', () => {
		fc.assert(
			fc.property(fc.integer({ min: 1000, max: 1e12 }), fc.boolean(), (n, withDecimals) => {
				const options = withDecimals ? { minimumFractionDigits: 2 } : {};
				const usGrouped = n.toLocaleString('en-US', options);
				const deGrouped = n.toLocaleString('de-DE', options);
				expect(read(usGrouped).ok).toBe(false);
				expect(read(deGrouped, 'comma').ok).toBe(false);
			})
		);
	});

	it('never throws, and a read value is always finite', () => {
		fc.assert(
			fc.property(fc.string(), fc.constantFrom<DecimalMark>('point', 'comma'), (text, mark) => {
				const result = read(text, mark);
				if (result.ok) expect(Number.isFinite(result.value)).toBe(true);
				else expect(result.message.startsWith('Quantity: ')).toBe(true);
			})
		);
	});

	it('shows what it read in a form that reads back to the same value', () => {
		fc.assert(
			fc.property(finiteNumbers, fc.constantFrom<DecimalMark>('point', 'comma'), (x, mark) => {
				const shown = formatReadNumber(x, mark);
				const again = read(shown, mark);
				expect(again.ok && again.value === x).toBe(true);
			})
		);
	});
});

describe('units are the documented ones', () => {
	it('reads the usual spellings and refuses anything else', () => {
		expect(readQuantityUnit('ml')).toBe('mL');
		expect(readQuantityUnit('uL')).toBe('µL');
		expect(readQuantityUnit('μg')).toBe('µg');
		for (const other of ['lb', 'oz', 'gal', 'kL', 'toString', '__proto__', ''])
			expect(readQuantityUnit(other)).toBeNull();
		expect(readAmountText('2 lb', 'Mass', ['g', 'kg'], 'g')).toEqual({
			ok: false,
			message: 'Mass: “lb” is not a mass unit here: use g, kg.'
		});
		expect(readAmountText('1,500 g', 'Mass', ['g', 'kg'], 'g')).toMatchObject({
			ok: false,
			message: expect.stringContaining('is ambiguous')
		});
	});

	it('reads a stock level in any documented unit, a volume through the density', () => {
		expect(readGramsText('2 kg', 'Reorder level', null)).toEqual({
			ok: true,
			grams: 2000,
			readAs: '2 kg'
		});
		expect(readGramsText('500', 'Reorder level', null)).toMatchObject({ ok: true, grams: 500 });
		// 1 L of a liquid of 1.2 g/mL is 1000 mL × 1.2 g/mL = 1200 g (hand calculation).
		expect(readGramsText('1 L', 'Reorder level', 1.2)).toEqual({
			ok: true,
			grams: 1200,
			readAs: '1 L = 1200 g at 1.2 g/mL'
		});
		expect(readGramsText('1 L', 'Reorder level', null)).toMatchObject({
			ok: false,
			message: expect.stringContaining('needs the component’s density')
		});
		expect(readGramsText('3 lb', 'Reorder level', null)).toMatchObject({ ok: false });
	});
});
