import { and, asc, count, desc, eq, gte, inArray, like, lte, or, sql, type SQL } from 'drizzle-orm';
import { db, type Db } from './db';
import { auditEvent, user } from './db/schema';
import { nextLink } from './trail/chain';

export interface Actor {
	id: string | null;
	email: string | null;
	address?: string | null;
	/** The API token the act came through, named in the entry so the trail tells a script from a person. */
	viaToken?: { id: string; name: string } | null;
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
		detail: actor.viaToken
			? { ...entry.detail, viaToken: { id: actor.viaToken.id, name: actor.viaToken.name } }
			: (entry.detail ?? null)
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
	/** an exact action code, or a prefix such as "lot." */
	action?: string;
	/** part of the person's e-mail or name */
	actor?: string;
	subjectType?: string;
	subjectId?: string;
	from?: Date;
	to?: Date;
	/** newest first unless told otherwise */
	order?: 'newest' | 'oldest';
}

function auditWhere(filter: AuditFilter): SQL | undefined {
	const conditions: SQL[] = [];
	if (filter.action) conditions.push(like(auditEvent.action, `${filter.action}%`));
	if (filter.actor) {
		const part = `%${filter.actor.toLowerCase()}%`;
		const named = db.select({ id: user.id }).from(user).where(like(user.name, part));
		conditions.push(or(like(auditEvent.actorEmail, part), inArray(auditEvent.actorId, named))!);
	}
	if (filter.subjectType) conditions.push(eq(auditEvent.subjectType, filter.subjectType));
	if (filter.subjectId) conditions.push(eq(auditEvent.subjectId, filter.subjectId));
	if (filter.from) conditions.push(gte(auditEvent.at, filter.from));
	if (filter.to) conditions.push(lte(auditEvent.at, filter.to));
	return conditions.length ? and(...conditions) : undefined;
}

function auditOrder(filter: AuditFilter) {
	return filter.order === 'oldest'
		? [asc(auditEvent.at), asc(auditEvent.seq)]
		: [desc(auditEvent.at), desc(auditEvent.seq)];
}

/** How many entries match the filter. */
export function countAuditEvents(filter: AuditFilter): number {
	return db.select({ total: count() }).from(auditEvent).where(auditWhere(filter)).get()!.total;
}

/** One page of the entries matching the filter, and how many match in all. */
export function listAuditEvents(filter: AuditFilter & { page: number; pageSize: number }) {
	const where = auditWhere(filter);
	const total = countAuditEvents(filter);
	// Deferred join: the page's keys are counted off in the (at, seq) index alone, and only the 50
	// rows shown are read; OFFSET over whole rows read every skipped entry (87 ms at page 2,000).
	// rowid, not seq: every row has one, and every index carries it.
	const pageKeys = db
		.select({ key: sql`"audit_event"."rowid"` })
		.from(auditEvent)
		.where(where)
		.orderBy(...auditOrder(filter))
		.limit(filter.pageSize)
		.offset((filter.page - 1) * filter.pageSize);
	const rows = db
		.select()
		.from(auditEvent)
		.where(inArray(sql`"audit_event"."rowid"`, pageKeys))
		.orderBy(...auditOrder(filter))
		.all();
	return { rows, total };
}

export interface AuditKey {
	atMs: number;
	seq: number;
}

/**
 * The next `limit` entries matching the filter after `after`, in the filter's order: a keyset read
 * on the (at, seq) index, so an export of a site's whole trail goes a chunk at a time.
 */
export function auditEventsAfter(filter: AuditFilter, after: AuditKey | null, limit: number) {
	const beyond =
		after === null
			? undefined
			: filter.order === 'oldest'
				? sql`(${auditEvent.at}, ${auditEvent.seq}) > (${after.atMs}, ${after.seq})`
				: sql`(${auditEvent.at}, ${auditEvent.seq}) < (${after.atMs}, ${after.seq})`;
	return db
		.select()
		.from(auditEvent)
		.where(and(auditWhere(filter), beyond))
		.orderBy(...auditOrder(filter))
		.limit(limit)
		.all();
}

/** Every entry matching the filter, in order: what an export writes. */
export function allAuditEvents(filter: AuditFilter) {
	return db
		.select()
		.from(auditEvent)
		.where(auditWhere(filter))
		.orderBy(...auditOrder(filter))
		.all();
}

export function listAuditActions(): string[] {
	return db
		.selectDistinct({ action: auditEvent.action })
		.from(auditEvent)
		.orderBy(auditEvent.action)
		.all()
		.map((r) => r.action);
}

/** The latest entries about one record, newest first, read through the (subject, at) index. */
export function auditEventsFor(subjectType: string, subjectId: string, limit = 50) {
	return db
		.select()
		.from(auditEvent)
		.where(and(eq(auditEvent.subjectType, subjectType), eq(auditEvent.subjectId, subjectId)))
		.orderBy(desc(auditEvent.at))
		.limit(limit)
		.all();
}
