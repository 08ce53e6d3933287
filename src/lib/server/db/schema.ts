import { sql } from 'drizzle-orm';
import {
	index,
	integer,
	primaryKey,
	sqliteTable,
	text,
	uniqueIndex
} from 'drizzle-orm/sqlite-core';
import type { Role } from '$lib/roles';
import { chainColumns, createdAt, id } from './columns';

export const user = sqliteTable('user', {
	id: id(),
	email: text('email').notNull().unique(),
	name: text('name').notNull(),
	passwordHash: text('password_hash').notNull(),
	active: integer('active', { mode: 'boolean' }).notNull().default(true),
	/** 'service': the account a service token acts as; it has no password and never signs in. */
	kind: text('kind').$type<'person' | 'service'>().notNull().default('person'),
	createdAt: createdAt(),
	deactivatedAt: integer('deactivated_at', { mode: 'timestamp_ms' })
});

export const userRole = sqliteTable(
	'user_role',
	{
		userId: text('user_id')
			.notNull()
			.references(() => user.id, { onDelete: 'cascade' }),
		role: text('role').$type<Role>().notNull()
	},
	(t) => [primaryKey({ columns: [t.userId, t.role] })]
);

/**
 * A signed-in session. `id` is the SHA-256 (hex) of the token in the cookie, never the token itself;
 * `expires_at` is the idle limit (moved on use), `created_at` anchors the absolute limit.
 */
export const session = sqliteTable(
	'session',
	{
		id: text('id').primaryKey(),
		userId: text('user_id')
			.notNull()
			.references(() => user.id, { onDelete: 'cascade' }),
		createdAt: integer('created_at', { mode: 'timestamp_ms' }).notNull(),
		expiresAt: integer('expires_at', { mode: 'timestamp_ms' }).notNull()
	},
	(t) => [index('session_user_idx').on(t.userId)]
);

export const invitation = sqliteTable('invitation', {
	id: id(),
	email: text('email').notNull(),
	name: text('name').notNull().default(''),
	roles: text('roles', { mode: 'json' }).$type<Role[]>().notNull(),
	tokenHash: text('token_hash').notNull().unique(),
	invitedBy: text('invited_by')
		.notNull()
		.references(() => user.id),
	createdAt: createdAt(),
	expiresAt: integer('expires_at', { mode: 'timestamp_ms' }).notNull(),
	acceptedAt: integer('accepted_at', { mode: 'timestamp_ms' }),
	revokedAt: integer('revoked_at', { mode: 'timestamp_ms' })
});

export const passwordReset = sqliteTable('password_reset', {
	id: id(),
	userId: text('user_id')
		.notNull()
		.references(() => user.id, { onDelete: 'cascade' }),
	tokenHash: text('token_hash').notNull().unique(),
	createdAt: createdAt(),
	expiresAt: integer('expires_at', { mode: 'timestamp_ms' }).notNull(),
	usedAt: integer('used_at', { mode: 'timestamp_ms' })
});

/** Reset links asked for, by address and e-mail, whether or not an account uses the address. */
export const resetRequest = sqliteTable(
	'reset_request',
	{
		id: id(),
		email: text('email').notNull(),
		address: text('address').notNull(),
		at: integer('at', { mode: 'timestamp_ms' }).notNull()
	},
	(t) => [
		index('reset_request_email_idx').on(t.email, t.at),
		index('reset_request_address_idx').on(t.address, t.at)
	]
);

export const signInAttempt = sqliteTable(
	'sign_in_attempt',
	{
		id: id(),
		email: text('email').notNull(),
		address: text('address').notNull(),
		succeeded: integer('succeeded', { mode: 'boolean' }).notNull(),
		at: integer('at', { mode: 'timestamp_ms' }).notNull()
	},
	(t) => [
		index('attempt_email_idx').on(t.email, t.at),
		index('attempt_address_idx').on(t.address, t.at)
	]
);

/**
 * Append-only: triggers in a migration refuse UPDATE and DELETE. Each row is chained to the one
 * before it (see src/lib/server/trail/chain.ts).
 */
export const auditEvent = sqliteTable(
	'audit_event',
	{
		id: id(),
		at: integer('at', { mode: 'timestamp_ms' })
			.notNull()
			.$defaultFn(() => new Date()),
		actorId: text('actor_id'),
		actorEmail: text('actor_email'),
		action: text('action').notNull(),
		subjectType: text('subject_type'),
		subjectId: text('subject_id'),
		detail: text('detail', { mode: 'json' }).$type<Record<string, unknown>>(),
		address: text('address'),
		...chainColumns()
	},
	(t) => [
		// (at, seq): the trail's order, so a deep page is counted off in the index alone.
		index('audit_at_seq_idx').on(t.at, t.seq),
		index('audit_action_idx').on(t.action),
		index('audit_subject_idx').on(t.subjectType, t.subjectId, t.at),
		uniqueIndex('audit_seq_idx').on(t.seq),
		uniqueIndex('audit_prev_hash_idx').on(t.prevHash)
	]
);

/** What the stand-in SMTP server received. */
export const mailMessage = sqliteTable(
	'mail_message',
	{
		id: id(),
		receivedAt: integer('received_at', { mode: 'timestamp_ms' })
			.notNull()
			.$defaultFn(() => new Date()),
		sender: text('sender').notNull(),
		recipients: text('recipients', { mode: 'json' }).$type<string[]>().notNull(),
		subject: text('subject').notNull(),
		textBody: text('text_body').notNull(),
		htmlBody: text('html_body'),
		sizeBytes: integer('size_bytes').notNull()
	},
	(t) => [index('mail_received_idx').on(t.receivedAt)]
);

export const siteSetting = sqliteTable('site_setting', {
	key: text('key').primaryKey(),
	value: text('value').notNull(),
	updatedAt: integer('updated_at', { mode: 'timestamp_ms' })
		.notNull()
		.default(sql`(unixepoch() * 1000)`)
});

export type User = typeof user.$inferSelect;
export type Invitation = typeof invitation.$inferSelect;
export type AuditEvent = typeof auditEvent.$inferSelect;
export type MailMessage = typeof mailMessage.$inferSelect;

// Each domain keeps its tables in its own file; they are all part of this one schema.
// (add `export * from './<domain>.schema';` lines here)
export * from './recipes.schema';
export * from './simulation.schema';
export * from './inventory.schema';
export * from './batches.schema';
export * from './studies.schema';
export * from './runs.schema';
export * from './tokens.schema';
