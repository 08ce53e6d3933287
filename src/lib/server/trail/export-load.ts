import { error } from '@sveltejs/kit';
import { allAuditEvents } from '../audit';
import { readableEntries } from './entries';
import { filterSummary, readTrailFilter } from './filter';
import { resolveSubjects, subjectKey } from './subjects';

/**
 * Every entry the trail page would show for this address, across all its pages. A filter part the
 * page would ignore is refused here instead, so an export never silently says more than was asked.
 */
export function entriesToExport(url: URL) {
	const read = readTrailFilter(url);
	if (read.problems.length) error(400, read.problems.join(' '));
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

/** "audit-trail-2026-03-04" and its extension. */
export function exportFileName(extension: 'csv' | 'pdf', now = new Date()): string {
	return `audit-trail-${now.toISOString().slice(0, 10)}.${extension}`;
}
