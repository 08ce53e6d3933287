import { and, count, desc, eq, gte, like, lte, type SQL } from 'drizzle-orm';
import { db, type Db } from './db';
import { auditEvent } from './db/schema';
import { nextLink } from './trail/chain';

export interface Actor {
	id: string | null;
	email: string | null;
	address?: string | null;
}

export interface AuditEntry {
	action: string;
	subjectType?: string;
	subjectId?: string;
	detail?: Record<string, unknown>;
}

type Writer = Pick<Db, 'insert'>;

/** Appends one event, chained to the one before; pass the transaction when it belongs to a larger write. */
export function recordAudit(actor: Actor, entry: AuditEntry, writer: Writer = db): void {
	const values = {
		id: crypto.randomUUID(),
		at: new Date(),
		actorId: actor.id,
		actorEmail: actor.email,
		address: actor.address ?? null,
		action: entry.action,
		subjectType: entry.subjectType ?? null,
		subjectId: entry.subjectId ?? null,
		detail: entry.detail ?? null
	};
	const stored = {
		id: values.id,
		at: values.at.getTime(),
		actor_id: values.actorId,
		actor_email: values.actorEmail,
		action: values.action,
		subject_type: values.subjectType,
		subject_id: values.subjectId,
		detail: values.detail === null ? null : JSON.stringify(values.detail),
		address: values.address
	};
	writer
		.insert(auditEvent)
		.values({ ...values, ...nextLink(db.$client, 'audit_event', stored) })
		.run();
}

/** A field's value before and after a change, as an audit entry records it. */
export type FieldChange = { from: unknown; to: unknown };

/**
 * Each field of `after` whose value differs from `before`, with both values, so the trail keeps
 * what was there as well as what replaced it. Times and revision counters are left out.
 */
export function changesBetween(before: object, after: object): Record<string, FieldChange> {
	const changes: Record<string, FieldChange> = {};
	for (const [field, to] of Object.entries(after)) {
		if (field === 'revision' || field === 'updatedAt' || to instanceof Date) continue;
		const from = (before as Record<string, unknown>)[field] ?? null;
		if (JSON.stringify(from) !== JSON.stringify(to ?? null))
			changes[field] = { from, to: to ?? null };
	}
	return changes;
}

export interface AuditFilter {
	action?: string;
	actor?: string;
	from?: Date;
	to?: Date;
	page: number;
	pageSize: number;
}

export function listAuditEvents(filter: AuditFilter) {
	const conditions: SQL[] = [];
	if (filter.action) conditions.push(like(auditEvent.action, `${filter.action}%`));
	if (filter.actor) conditions.push(like(auditEvent.actorEmail, `%${filter.actor.toLowerCase()}%`));
	if (filter.from) conditions.push(gte(auditEvent.at, filter.from));
	if (filter.to) conditions.push(lte(auditEvent.at, filter.to));
	const where = conditions.length ? and(...conditions) : undefined;
	const [{ total }] = db.select({ total: count() }).from(auditEvent).where(where).all();
	const rows = db
		.select()
		.from(auditEvent)
		.where(where)
		.orderBy(desc(auditEvent.at), desc(auditEvent.id))
		.limit(filter.pageSize)
		.offset((filter.page - 1) * filter.pageSize)
		.all();
	return { rows, total };
}

export function listAuditActions(): string[] {
	return db
		.selectDistinct({ action: auditEvent.action })
		.from(auditEvent)
		.orderBy(auditEvent.action)
		.all()
		.map((r) => r.action);
}

export function auditEventsFor(subjectType: string, subjectId: string) {
	return db
		.select()
		.from(auditEvent)
		.where(and(eq(auditEvent.subjectType, subjectType), eq(auditEvent.subjectId, subjectId)))
		.orderBy(desc(auditEvent.at))
		.all();
}
