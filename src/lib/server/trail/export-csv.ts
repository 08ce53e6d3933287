import { unparseCsv } from '../csv';
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

/** The entries as CSV, one row each, every text cell guarded against formula injection. */
export function trailCsv(entries: TrailEntry[], origin = ''): string {
	const data = entries.map((e) => [
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
	]);
	return unparseCsv(TRAIL_CSV_COLUMNS, data);
}
