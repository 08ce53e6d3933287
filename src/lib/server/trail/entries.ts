import { formatDateTime, formatIsoLocal } from '$lib/date-time';
import { siteTimeZone } from '../site-time-zone';
import type { AuditEvent } from '../db/schema';
import { changeLines, type ChangeLine } from './changes';
import { describeAction } from './describe';
import { peopleNamed, resolveSubjects, subjectKey, type TrailSubject } from './subjects';

/** One audit entry as an inspector reads it. */
export interface TrailEntry {
	id: string;
	at: Date;
	/** In the site's zone, to the second, for pages and PDFs. */
	atText: string;
	/** ISO 8601 with the site's offset, for CSV. */
	atIso: string;
	who: string;
	whoEmail: string | null;
	action: string;
	sentence: string;
	subject: TrailSubject;
	changes: ChangeLine[];
	address: string | null;
}

/** "2026-12-03 14:05:09 CET": a trail moment in the site's zone, to the second. */
export function trailTimeText(at: Date, timeZone = siteTimeZone()): string {
	return formatDateTime(at, timeZone, { seconds: true });
}

/** Stored events → readable entries; subjects and people are looked up once per kind for the lot. */
export function readableEntries(rows: AuditEvent[]): TrailEntry[] {
	const subjects = resolveSubjects(rows);
	const names = peopleNamed(rows.map((r) => r.actorId));
	const timeZone = siteTimeZone();
	return rows.map((row) => {
		const subject = subjects.get(subjectKey(row.subjectType, row.subjectId))!;
		const detail = row.detail ?? null;
		const name = row.actorId ? names.get(row.actorId) : undefined;
		return {
			id: row.id,
			at: row.at,
			atText: trailTimeText(row.at, timeZone),
			atIso: formatIsoLocal(row.at, timeZone),
			who: name ?? row.actorEmail ?? 'system',
			whoEmail: row.actorEmail,
			action: row.action,
			sentence: describeAction(row.action, detail, subject.label),
			subject,
			changes: changeLines(row.action, detail),
			address: row.address
		};
	});
}

export function changeText(change: ChangeLine): string {
	return `${change.field}: ${change.from} → ${change.to}`;
}
