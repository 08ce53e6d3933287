import { error } from '@sveltejs/kit';
import { allAuditEvents, countAuditEvents } from '../audit';
import { readableEntries } from './entries';
import { filterSummary, readTrailFilter } from './filter';
import { resolveSubjects, subjectKey } from './subjects';

/** A PDF is read by a person: past this many entries, a narrower filter or the CSV serve better. */
export const MAX_PDF_ENTRIES = 5000;

/**
 * Every entry the trail page would show for this address, across all its pages. A filter part the
 * page would ignore is refused here instead, so an export never silently says more than was asked.
 */
export function entriesToExport(url: URL) {
	const read = exportFilter(url);
	const total = countAuditEvents(read.filter);
	if (total > MAX_PDF_ENTRIES)
		error(
			400,
			`The filter matches ${total.toLocaleString('en')} entries; a PDF holds at most ${MAX_PDF_ENTRIES.toLocaleString('en')}. Narrow the dates or the action, or export CSV, which has no limit.`
		);
	const entries = readableEntries(allAuditEvents(read.filter));
	const { subjectType, subjectId } = read.filter;
	let subjectLabel: string | undefined;
	if (subjectType && subjectId) {
		const subject = resolveSubjects([{ subjectType, subjectId }]).get(
			subjectKey(subjectType, subjectId)
		)!;
		subjectLabel = `${subject.typeLabel} ${subject.label}`;
	}
	return { entries, summary: filterSummary(read.text, subjectLabel) };
}

/** The trail page's filter for this address; a part the page would ignore is refused. */
export function exportFilter(url: URL) {
	const read = readTrailFilter(url);
	if (read.problems.length) error(400, read.problems.join(' '));
	return read;
}

/** "audit-trail-2026-03-04" and its extension. */
export function exportFileName(extension: 'csv' | 'pdf', now = new Date()): string {
	return `audit-trail-${now.toISOString().slice(0, 10)}.${extension}`;
}
