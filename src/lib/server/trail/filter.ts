import type { AuditFilter } from '../audit';
import { SUBJECT_TYPES } from './subjects';

/** The trail's filter as typed in the address bar, for refilling the form and building links. */
export interface TrailFilterText {
	type: string;
	subject: string;
	actor: string;
	action: string;
	from: string;
	to: string;
	order: 'newest' | 'oldest';
}

export interface TrailFilterRead {
	filter: AuditFilter;
	text: TrailFilterText;
	/** one sentence per part of the filter that could not be used (and was ignored) */
	problems: string[];
}

function dateParam(
	value: string,
	label: string,
	endOfDay: boolean
): { date?: Date; problem?: string } {
	if (!value) return {};
	const date = new Date(`${value}T${endOfDay ? '23:59:59.999' : '00:00:00'}Z`);
	if (!/^\d{4}-\d{2}-\d{2}$/.test(value) || Number.isNaN(date.getTime())) {
		return {
			problem: `${label}: “${value}” is not a date (use YYYY-MM-DD); this filter is ignored.`
		};
	}
	return { date };
}

const KNOWN_TYPES = new Set(SUBJECT_TYPES.map((t) => t.value));

/**
 * Reads ?type=, ?subject=<type>:<id>, ?actor=, ?action=, ?from=, ?to= and ?order=. Anything that
 * cannot be used is named in `problems` and left out, so the page still shows the rest.
 */
export function readTrailFilter(url: URL): TrailFilterRead {
	const param = (name: string) => (url.searchParams.get(name) ?? '').trim().slice(0, 200);
	const text: TrailFilterText = {
		type: param('type'),
		subject: param('subject'),
		actor: param('actor'),
		action: param('action'),
		from: param('from'),
		to: param('to'),
		order: param('order') === 'oldest' ? 'oldest' : 'newest'
	};
	const problems: string[] = [];
	const filter: AuditFilter = {
		actor: text.actor || undefined,
		action: text.action || undefined,
		order: text.order
	};
	if (text.type) {
		if (KNOWN_TYPES.has(text.type)) filter.subjectType = text.type;
		else
			problems.push(
				`Subject type: “${text.type}” is not one the trail knows; this filter is ignored.`
			);
	}
	if (text.subject) {
		const split = text.subject.indexOf(':');
		if (split > 0 && split < text.subject.length - 1) {
			filter.subjectType = text.subject.slice(0, split);
			filter.subjectId = text.subject.slice(split + 1);
		} else {
			problems.push(`Subject: “${text.subject}” is not <type>:<id>; this filter is ignored.`);
		}
	}
	const from = dateParam(text.from, 'From', false);
	const to = dateParam(text.to, 'To', true);
	filter.from = from.date;
	filter.to = to.date;
	for (const p of [from.problem, to.problem]) if (p) problems.push(p);
	if (filter.from && filter.to && filter.from > filter.to)
		problems.push('From is after To, so no entry can match; swap the dates.');
	return { filter, text, problems };
}

/** The filter as a query string (without page), for export links that match the view. */
export function trailQuery(text: TrailFilterText): string {
	const params = new URLSearchParams();
	for (const [key, value] of Object.entries(text)) {
		if (value && !(key === 'order' && value === 'newest')) params.set(key, value);
	}
	const query = params.toString();
	return query ? `?${query}` : '';
}

/** The filter in words for an export's heading: "Lot L-2026-0004 · person “ana” · newest first". */
export function filterSummary(text: TrailFilterText, subjectLabel?: string): string {
	const parts = [
		subjectLabel ?? (text.subject ? `subject ${text.subject}` : ''),
		text.type && !text.subject ? `subject type ${text.type.replace(/_/g, ' ')}` : '',
		text.actor ? `person “${text.actor}”` : '',
		text.action ? `act ${text.action}` : '',
		text.from ? `from ${text.from}` : '',
		text.to ? `to ${text.to}` : ''
	].filter(Boolean);
	const order = text.order === 'oldest' ? 'oldest first' : 'newest first';
	return parts.length ? `Filter: ${parts.join(' · ')} · ${order}` : `All entries, ${order}`;
}
