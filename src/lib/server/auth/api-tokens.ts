// API tokens on the same pattern as sessions: a random secret shown once, only its SHA-256 stored.
// A token reads `bwt_<id>_<secret>`: the id finds the row (and names the token in logs and the
// trail without the secret), the secret is compared in constant time.
import { sha256 } from '@oslojs/crypto/sha2';
import { constantTimeEqual } from '@oslojs/crypto/subtle';
import { encodeBase32LowerCaseNoPadding, encodeHexLowerCase } from '@oslojs/encoding';
import { and, asc, desc, eq, gt, isNull } from 'drizzle-orm';
import type { Act } from '$lib/permissions';
import type { Role } from '$lib/roles';
import { recordAudit, type Actor } from '../audit';
import { db } from '../db';
import { apiToken, user, userRole, type ApiToken, type ApiTokenKind } from '../db/schema';
import { rolesOf } from '../people';

export const TOKEN_PREFIX = 'bwt_';
const TOKEN_SHAPE = /^bwt_([a-z2-7]{16})_([a-z2-7]{52})$/;
/** Anything that looks like one of our tokens, wherever it appears (a query string, a log). */
export const TOKEN_LIKE = /bwt_[a-z2-7]{8,}/i;
export const MAX_TOKEN_DAYS = 366;
const DAY_MS = 24 * 60 * 60 * 1000;
/** Last use is written at most once a minute per token: a controller pushing every second costs nothing. */
const LAST_USE_EVERY_MS = 60_000;

function randomBase32(bytes: number): string {
	const buffer = new Uint8Array(bytes);
	crypto.getRandomValues(buffer);
	return encodeBase32LowerCaseNoPadding(buffer);
}

function hashSecret(secret: string): string {
	return encodeHexLowerCase(sha256(new TextEncoder().encode(secret)));
}

export interface TokenRequest {
	kind: ApiTokenKind;
	name: string;
	/** The person (personal) or the service account (service) the token acts as. */
	userId: string;
	scopes: Act[];
	expiresAt: Date;
	requestsPerMinute: number;
}

/** Stores a new token and returns its text: the only time the secret exists outside the caller. */
export function issueToken(actor: Actor & { id: string }, request: TokenRequest): string {
	const id = randomBase32(10);
	const secret = randomBase32(32);
	db.transaction((tx) => {
		tx.insert(apiToken)
			.values({ id, ...request, secretHash: hashSecret(secret), createdById: actor.id })
			.run();
		recordAudit(
			actor,
			{
				action: 'token.created',
				subjectType: 'api_token',
				subjectId: id,
				detail: {
					name: request.name,
					kind: request.kind,
					scopes: request.scopes,
					expiresAt: request.expiresAt.toISOString(),
					requestsPerMinute: request.requestsPerMinute
				}
			},
			tx
		);
	});
	return `${TOKEN_PREFIX}${id}_${secret}`;
}

export type BearerCheck =
	| { ok: true; token: ApiToken; user: { id: string; email: string; name: string; roles: Role[] } }
	| { ok: false; detail: string };

function dateOf(at: Date): string {
	return at.toISOString().slice(0, 10);
}

/** The token an `Authorization` header presents, or why it opens nothing. */
export function checkBearer(header: string, now = new Date()): BearerCheck {
	const [scheme, text, ...rest] = header.trim().split(/\s+/);
	if (scheme?.toLowerCase() !== 'bearer' || !text || rest.length)
		return { ok: false, detail: 'Authorization must read “Bearer ” and then one token.' };
	const shape = TOKEN_SHAPE.exec(text);
	if (!shape)
		return {
			ok: false,
			detail: 'That is not a Brothwright API token: tokens start with bwt_ (Account → API tokens).'
		};
	const row = db.select().from(apiToken).where(eq(apiToken.id, shape[1])).get();
	const presented = new TextEncoder().encode(hashSecret(shape[2]));
	if (!row || !constantTimeEqual(presented, new TextEncoder().encode(row.secretHash)))
		return { ok: false, detail: 'This token is not one this site issued.' };
	if (row.revokedAt)
		return {
			ok: false,
			detail: `This token (“${row.name}”) was revoked on ${dateOf(row.revokedAt)}.`
		};
	if (row.expiresAt <= now)
		return {
			ok: false,
			detail: `This token (“${row.name}”) expired on ${dateOf(row.expiresAt)}; make a new one.`
		};
	const owner = db.select().from(user).where(eq(user.id, row.userId)).get();
	if (!owner?.active)
		return { ok: false, detail: `The account this token (“${row.name}”) acts as is deactivated.` };
	noteUse(row, now);
	return {
		ok: true,
		token: row,
		user: { id: owner.id, email: owner.email, name: owner.name, roles: rolesOf(owner.id) }
	};
}

function noteUse(row: ApiToken, now: Date): void {
	if (row.lastUsedAt && now.getTime() - row.lastUsedAt.getTime() < LAST_USE_EVERY_MS) return;
	db.update(apiToken).set({ lastUsedAt: now }).where(eq(apiToken.id, row.id)).run();
}

/** Whether the token grants the act; the first use of each scope is written to the trail. */
export function tokenGrants(token: ApiToken, act: Act, actor: Actor): boolean {
	if (!token.scopes.includes(act)) return false;
	if (!token.usedScopes.includes(act)) {
		db.transaction((tx) => {
			const current = tx.select().from(apiToken).where(eq(apiToken.id, token.id)).get();
			if (!current || current.usedScopes.includes(act)) return;
			tx.update(apiToken)
				.set({ usedScopes: [...current.usedScopes, act], lastUsedAddress: actor.address ?? null })
				.where(eq(apiToken.id, token.id))
				.run();
			recordAudit(
				actor,
				{
					action: 'token.scope_first_used',
					subjectType: 'api_token',
					subjectId: token.id,
					detail: { name: token.name, scope: act }
				},
				tx
			);
		});
	}
	return true;
}

/** Ends a token at once; the trail keeps who and why. */
export function revokeToken(actor: Actor & { id: string }, tokenId: string, reason: string): void {
	db.transaction((tx) => {
		const row = tx.select().from(apiToken).where(eq(apiToken.id, tokenId)).get();
		if (!row || row.revokedAt) return;
		tx.update(apiToken)
			.set({ revokedAt: new Date(), revokedById: actor.id })
			.where(eq(apiToken.id, tokenId))
			.run();
		// A service account lives for its token only.
		if (row.kind === 'service')
			tx.update(user)
				.set({ active: false, deactivatedAt: new Date() })
				.where(eq(user.id, row.userId))
				.run();
		recordAudit(
			actor,
			{
				action: 'token.revoked',
				subjectType: 'api_token',
				subjectId: tokenId,
				detail: { name: row.name, kind: row.kind, reason }
			},
			tx
		);
	});
}

export function findToken(tokenId: string): ApiToken | undefined {
	return db.select().from(apiToken).where(eq(apiToken.id, tokenId)).get();
}

/** A person's personal tokens, newest first. */
export function personalTokensOf(userId: string): ApiToken[] {
	return db
		.select()
		.from(apiToken)
		.where(and(eq(apiToken.userId, userId), eq(apiToken.kind, 'personal')))
		.orderBy(desc(apiToken.createdAt))
		.all();
}

/** Tokens that still open the API: not revoked and not expired. */
export function liveTokenCount(userId: string, now = new Date()): number {
	return db
		.select({ id: apiToken.id })
		.from(apiToken)
		.where(
			and(
				eq(apiToken.userId, userId),
				eq(apiToken.kind, 'personal'),
				isNull(apiToken.revokedAt),
				gt(apiToken.expiresAt, now)
			)
		)
		.all().length;
}

export interface ListedToken extends ApiToken {
	ownerName: string;
	ownerEmail: string;
	roles: Role[];
}

/** Every token of a kind with the account it acts as (service tokens with their role set). */
export function tokensOfKind(kind: ApiTokenKind): ListedToken[] {
	const rows = db
		.select({ token: apiToken, ownerName: user.name, ownerEmail: user.email })
		.from(apiToken)
		.innerJoin(user, eq(user.id, apiToken.userId))
		.where(eq(apiToken.kind, kind))
		.orderBy(asc(apiToken.revokedAt), desc(apiToken.createdAt))
		.all();
	const roleRows = db.select().from(userRole).all();
	return rows.map((r) => ({
		...r.token,
		ownerName: r.ownerName,
		ownerEmail: r.ownerEmail,
		roles: roleRows.filter((x) => x.userId === r.token.userId).map((x) => x.role)
	}));
}

export function expiryFrom(days: number, now = new Date()): Date {
	return new Date(now.getTime() + days * DAY_MS);
}
