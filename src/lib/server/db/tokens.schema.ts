import { sql } from 'drizzle-orm';
import { index, integer, sqliteTable, text } from 'drizzle-orm/sqlite-core';
import type { Act } from '$lib/permissions';
import { createdAt } from './columns';
import { user } from './schema';

export const API_TOKEN_KINDS = ['personal', 'service'] as const;
export type ApiTokenKind = (typeof API_TOKEN_KINDS)[number];

/**
 * A token for the JSON API. A personal token acts as its person, a service token as its own
 * service account (a `user` row of kind 'service' holding the token's role set). Only the SHA-256
 * of the secret is stored; the id is the token's public part, so it can be named without the secret.
 */
export const apiToken = sqliteTable(
	'api_token',
	{
		id: text('id').primaryKey(),
		kind: text('kind').$type<ApiTokenKind>().notNull(),
		name: text('name').notNull(),
		userId: text('user_id')
			.notNull()
			.references(() => user.id, { onDelete: 'cascade' }),
		secretHash: text('secret_hash').notNull(),
		scopes: text('scopes', { mode: 'json' }).$type<Act[]>().notNull(),
		/** The scopes the token has used so far: the first use of each is audited. */
		usedScopes: text('used_scopes', { mode: 'json' })
			.$type<Act[]>()
			.notNull()
			.default(sql`'[]'`),
		requestsPerMinute: integer('requests_per_minute').notNull(),
		createdAt: createdAt(),
		createdById: text('created_by_id')
			.notNull()
			.references(() => user.id),
		expiresAt: integer('expires_at', { mode: 'timestamp_ms' }).notNull(),
		lastUsedAt: integer('last_used_at', { mode: 'timestamp_ms' }),
		lastUsedAddress: text('last_used_address'),
		revokedAt: integer('revoked_at', { mode: 'timestamp_ms' }),
		revokedById: text('revoked_by_id').references(() => user.id)
	},
	(t) => [index('api_token_user_idx').on(t.userId)]
);

export type ApiToken = typeof apiToken.$inferSelect;
