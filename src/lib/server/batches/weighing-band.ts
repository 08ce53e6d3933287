// The hard band around what a line needs: beyond it, a weighing is a gross error until a second
// person witnesses it (a misplaced decimal point, grams typed as milligrams). The band is a site
// setting; ±10 % is common practice for a check that is wider than any line's tolerance.
import { eq } from 'drizzle-orm';
import { checkTolerance } from '$lib/batches';
import { recordAudit, type Actor } from '../audit';
import { db, type Db } from '../db';
import { siteSetting } from '../db/schema';
import { RuleError } from '../rule-error';

type Reader = Pick<Db, 'select'>;

export const HARD_BAND_KEY = 'batch.hard_band_percent';
export const DEFAULT_HARD_BAND_PERCENT = 10;
export const HARD_BAND_RANGE_PERCENT = { min: 1, max: 100 } as const;

export function hardBandPercent(reader: Reader = db): number {
	const stored = reader
		.select()
		.from(siteSetting)
		.where(eq(siteSetting.key, HARD_BAND_KEY))
		.get()?.value;
	const value = stored === undefined ? NaN : Number(stored);
	return Number.isFinite(value) ? value : DEFAULT_HARD_BAND_PERCENT;
}

/** Whether `actual` lies outside required ± band %. */
export function isBeyondHardBand(required: number, actual: number, bandPercent: number): boolean {
	return checkTolerance(required, actual, bandPercent) !== 'within';
}

export function setHardBandPercent(actor: Actor, text: string): void {
	const value = Number(text.trim());
	const { min, max } = HARD_BAND_RANGE_PERCENT;
	if (!text.trim() || !Number.isFinite(value) || value < min || value > max)
		throw new RuleError(
			`Hard band (%) must be a number from ${min} to ${max} (got “${text.trim()}”).`,
			{ field: 'hardBandPercent' }
		);
	db.transaction((tx) => {
		const before = hardBandPercent(tx);
		tx.insert(siteSetting)
			.values({ key: HARD_BAND_KEY, value: String(value) })
			.onConflictDoUpdate({
				target: siteSetting.key,
				set: { value: String(value), updatedAt: new Date() }
			})
			.run();
		recordAudit(
			actor,
			{
				action: 'settings.hard_band_percent',
				subjectType: 'site',
				detail: { from: before, to: value }
			},
			tx
		);
	});
}
