// The site's decimal mark: how every typed or imported number is read (src/lib/number-reading.ts).
// A site setting; the point until an administrator chooses the comma.
import {
	DECIMAL_MARKS,
	DECIMAL_MARK_LABELS,
	setSiteDecimalMark,
	type DecimalMark
} from '$lib/number-reading';
import type { Actor } from './audit';
import { db, type Db } from './db';
import { RuleError } from './rule-error';
import { settingText, storeSetting } from './site-settings';

type Reader = Pick<Db, 'select'>;

export const SITE_DECIMAL_MARK_KEY = 'site.decimal_mark';
export const SITE_DECIMAL_MARK_LABEL = 'Decimal mark';

function markOf(stored: string | undefined): DecimalMark {
	return DECIMAL_MARKS.find((m) => m === stored) ?? 'point';
}

export function storedDecimalMark(reader: Reader = db): DecimalMark {
	return markOf(settingText(SITE_DECIMAL_MARK_KEY, reader));
}

/** Makes the stored mark the one the readers use for this request (hooks.server.ts). */
export function applySiteDecimalMark(): DecimalMark {
	const mark = storedDecimalMark();
	setSiteDecimalMark(mark);
	return mark;
}

export function setStoredDecimalMark(actor: Actor, text: string): void {
	const mark = DECIMAL_MARKS.find((m) => m === text.trim());
	if (!mark)
		throw new RuleError(
			`${SITE_DECIMAL_MARK_LABEL}: choose ${DECIMAL_MARKS.map((m) => DECIMAL_MARK_LABELS[m]).join(' or ')}.`,
			{ field: 'decimalMark' }
		);
	storeSetting(
		actor,
		{ key: SITE_DECIMAL_MARK_KEY, value: mark, action: 'settings.decimal_mark' },
		markOf
	);
	setSiteDecimalMark(mark);
}
