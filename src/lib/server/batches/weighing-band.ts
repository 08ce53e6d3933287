// The hard band around what a line needs: beyond it, a weighing is a gross error until a second
// person witnesses it (a misplaced decimal point, grams typed as milligrams). The band is a site
// setting; ±10 % is common practice for a check that is wider than any line's tolerance.
import { readDecimalText } from '$lib/number-reading';
import { checkTolerance } from '$lib/batches';
import type { Actor } from '../audit';
import { db, type Db } from '../db';
import { RuleError } from '../rule-error';
import { settingText, storeSetting } from '../site-settings';

type Reader = Pick<Db, 'select'>;

export const HARD_BAND_KEY = 'batch.hard_band_percent';
export const DEFAULT_HARD_BAND_PERCENT = 10;
export const HARD_BAND_RANGE_PERCENT = { min: 1, max: 100 } as const;

/** The stored band, or the default when unset or unreadable. */
function bandOf(stored: string | undefined): number {
	const value = stored === undefined ? NaN : Number(stored);
	return Number.isFinite(value) ? value : DEFAULT_HARD_BAND_PERCENT;
}

export function hardBandPercent(reader: Reader = db): number {
	return bandOf(settingText(HARD_BAND_KEY, reader));
}

/** Whether `actual` lies outside required ± band %. */
export function isBeyondHardBand(required: number, actual: number, bandPercent: number): boolean {
	return checkTolerance(required, actual, bandPercent) !== 'within';
}

export function setHardBandPercent(actor: Actor, text: string): void {
	const read = readDecimalText(text, 'Hard band (%)');
	if (!read.ok) throw new RuleError(read.message, { field: 'hardBandPercent' });
	const value = read.value;
	const { min, max } = HARD_BAND_RANGE_PERCENT;
	if (value < min || value > max)
		throw new RuleError(
			`Hard band (%) must be a number from ${min} to ${max} (got “${text.trim()}”).`,
			{ field: 'hardBandPercent' }
		);
	storeSetting(
		actor,
		{ key: HARD_BAND_KEY, value: String(value), action: 'settings.hard_band_percent' },
		bandOf
	);
}
