import Papa from 'papaparse';
import { changeText, type TrailEntry } from './entries';

export const TRAIL_CSV_COLUMNS = [
	'When (UTC)',
	'Person',
	'E-mail',
	'What happened',
	'Subject type',
	'Subject',
	'Subject link',
	'Changes',
	'Action code',
	'From address'
] as const;

/**
 * A spreadsheet runs a cell that starts with = + - @ (or a tab or carriage return before one) as a
 * formula; a leading apostrophe makes it plain text.
 */
export function guardCell(value: string): string {
	return /^[=+\-@\t\r]/.test(value) ? `'${value}` : value;
}

/** The entries as CSV, one row each, every cell guarded against formula injection. */
export function trailCsv(entries: TrailEntry[], origin = ''): string {
	const data = entries.map((e) =>
		[
			e.atUtc,
			e.who,
			e.whoEmail ?? '',
			e.sentence,
			e.subject.typeLabel,
			e.subject.label,
			e.subject.href ? `${origin}${e.subject.href}` : '',
			e.changes.map(changeText).join('; '),
			e.action,
			e.address ?? ''
		].map(guardCell)
	);
	return Papa.unparse({ fields: [...TRAIL_CSV_COLUMNS], data });
}
