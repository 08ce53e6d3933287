import { and, eq, sql } from 'drizzle-orm';
import { DEFAULT_BATCH_NUMBER_PATTERN } from '$lib/batches';
import type { Actor } from '../audit';
import { db, type Db } from '../db';
import { batch } from '../db/schema';
import { RuleError } from '../rule-error';
import { settingText, storeSetting } from '../site-settings';

type Reader = Pick<Db, 'select'>;
export const BATCH_PATTERN_KEY = 'batch.number_pattern';
const TOKENS = ['{YYYY}', '{YY}', '{MM}', '{seq}'];

export function batchNumberPattern(reader: Reader = db): string {
	return settingText(BATCH_PATTERN_KEY, reader) ?? DEFAULT_BATCH_NUMBER_PATTERN;
}

/** Why a pattern cannot be used, or null. The sequence restarts each year, so the year must be in it. */
export function patternProblem(pattern: string): string | null {
	const trimmed = pattern.trim();
	if (!trimmed) return 'Enter a pattern, for example MB-{YYYY}-{seq}.';
	if (trimmed.length > 40) return 'At most 40 characters.';
	if (!trimmed.includes('{seq}')) return 'The pattern needs {seq}, the running number.';
	if (!trimmed.includes('{YYYY}') && !trimmed.includes('{YY}'))
		return 'The pattern needs {YYYY} or {YY}: the running number restarts every year.';
	const unknown = trimmed.replace(/\{YYYY\}|\{YY\}|\{MM\}|\{seq\}/g, '').match(/\{[^}]*\}/);
	if (unknown) return `${unknown[0]} is not a field; use ${TOKENS.join(', ')}.`;
	if (/[^A-Za-z0-9{}\-_/.]/.test(trimmed))
		return 'Use letters, digits and - _ / . only, so the number scans and files cleanly.';
	return null;
}

export function formatBatchNumber(pattern: string, date: Date, seq: number): string {
	const yyyy = String(date.getUTCFullYear());
	return pattern
		.replaceAll('{YYYY}', yyyy)
		.replaceAll('{YY}', yyyy.slice(2))
		.replaceAll('{MM}', String(date.getUTCMonth() + 1).padStart(2, '0'))
		.replaceAll('{seq}', String(seq).padStart(4, '0'));
}

/** The next number of the year; call inside the transaction that inserts the batch. */
export function nextBatchNumber(
	reader: Reader,
	now = new Date()
): { number: string; year: number; seq: number } {
	const year = now.getUTCFullYear();
	const row = reader
		.select({ last: sql<number | null>`max(${batch.numberSeq})` })
		.from(batch)
		.where(and(eq(batch.numberYear, year)))
		.get();
	const seq = (row?.last ?? 0) + 1;
	return { number: formatBatchNumber(batchNumberPattern(reader), now, seq), year, seq };
}

export function setBatchNumberPattern(actor: Actor, pattern: string): void {
	const problem = patternProblem(pattern);
	if (problem) throw new RuleError(problem, { field: 'pattern' });
	storeSetting(
		actor,
		{ key: BATCH_PATTERN_KEY, value: pattern.trim(), action: 'settings.batch_number_pattern' },
		(stored) => stored ?? DEFAULT_BATCH_NUMBER_PATTERN
	);
}
