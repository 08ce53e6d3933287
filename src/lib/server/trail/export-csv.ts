import { auditEventsAfter, type AuditFilter, type AuditKey } from '../audit';
import { unparseCsv } from '../csv';
import type { CsvExport } from '../csv-export';
import { changeText, readableEntries, type TrailEntry } from './entries';

export const TRAIL_CSV_COLUMNS = [
	'When',
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

/** The entries as CSV rows, every text cell guarded against formula injection when unparsed. */
export function trailCsvRows(entries: TrailEntry[], origin = ''): unknown[][] {
	return entries.map((e) => [
		e.atIso,
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
}

/** The entries as CSV, one row each. */
export function trailCsv(entries: TrailEntry[], origin = ''): string {
	return unparseCsv(TRAIL_CSV_COLUMNS, trailCsvRows(entries, origin));
}

/** Every entry the filter matches as a CSV export read a chunk at a time. */
export function trailExport(filter: AuditFilter, origin = ''): CsvExport<AuditKey> {
	return {
		columns: TRAIL_CSV_COLUMNS,
		read: (after, limit) => {
			const rows = auditEventsAfter(filter, after, limit);
			const last = rows.at(-1);
			return {
				rows: trailCsvRows(readableEntries(rows), origin),
				last: last ? { atMs: last.at.getTime(), seq: last.seq ?? 0 } : null
			};
		}
	};
}
