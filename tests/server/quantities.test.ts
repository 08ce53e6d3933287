import { describe, expect, it } from 'vitest';
import {
	batchVolumeL,
	convertMass,
	convertVolume,
	formatMass,
	formatVolume,
	readAmountText,
	storedMass,
	storedVolumeUl
} from '$lib/quantities';

describe('conversions between mass and volume units', () => {
	// SI prefixes micro = 1e-6, milli = 1e-3, kilo = 1e3 (BIPM, The International System of Units, 9th ed. 2019, Table 7).
	it('follows the SI prefixes exactly, keeping decimal amounts at their decimal value', () => {
		expect(convertMass(350, 'mg', 'g')).toBe(0.35);
		expect(convertMass(1.2, 'kg', 'g')).toBe(1200);
		expect(convertMass(1, 'kg', 'µg')).toBe(1e9);
		expect(convertMass(2_500_000, 'µg', 'g')).toBe(2.5);
		expect(convertVolume(2.5, 'L', 'mL')).toBe(2500);
		expect(convertVolume(250, 'µL', 'mL')).toBe(0.25);
		expect(batchVolumeL(1500)).toBe(1.5);
	});

	it('keeps stored amounts as integers in the named unit', () => {
		expect(storedMass(12.75, 'g', 'µg')).toBe(12_750_000);
		expect(storedMass(0.0004, 'g', 'mg')).toBe(0);
		expect(storedVolumeUl(2.0004, 'mL')).toBe(2000);
	});
});

describe('one rounding rule for what is weighed or added', () => {
	// The rule (a balance's resolution, common practice): below 1 g in mg to 4 significant figures, up to 1 kg
	// in g to 1 mg, above in g to 0.1 g; volumes alike in µL / mL.
	it('shows masses as a bench balance reads them', () => {
		expect(formatMass(350_000, 'µg')).toBe('350 mg');
		expect(formatMass(123_456, 'µg')).toBe('123.5 mg');
		expect(formatMass(7_502_000, 'µg')).toBe('7.502 g');
		expect(formatMass(12_500_000, 'µg')).toBe('12.5 g');
		expect(formatMass(1_234_567_890, 'µg')).toBe('1234.6 g');
		expect(formatMass(-2, 'g')).toBe('−2 g');
	});

	it('shows volumes by the same rule', () => {
		expect(formatVolume(250, 'µL')).toBe('250 µL');
		expect(formatVolume(12_345.6, 'µL')).toBe('12.346 mL');
		expect(formatVolume(2, 'L')).toBe('2000 mL');
	});
});

describe('reading an amount with its unit', () => {
	it('reads an amount with its unit, in the unit given or the default', () => {
		expect(readAmountText('350 mg', 'Mass', ['g', 'mg'], 'g')).toEqual({
			ok: true,
			value: 350,
			unit: 'mg'
		});
		expect(readAmountText('12.5', 'Mass', ['g', 'mg'], 'g')).toMatchObject({
			ok: true,
			value: 12.5,
			unit: 'g'
		});
		expect(readAmountText('5 ug', 'Mass', ['µg', 'g'], 'g')).toMatchObject({
			ok: true,
			value: 5,
			unit: 'µg'
		});
		expect(readAmountText('5 kg', 'Mass', ['g', 'mg'], 'g')).toEqual({
			ok: false,
			message: 'Mass: “kg” is not a mass unit here: use g, mg.'
		});
	});
});
