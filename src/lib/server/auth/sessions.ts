// Sessions on the pattern the Oslo project recommends: the cookie holds a random token, the database
// holds only its SHA-256, so a leaked table cannot be replayed as cookies.
import type { Cookies } from '@sveltejs/kit';
import { sha256 } from '@oslojs/crypto/sha2';
import { constantTimeEqual } from '@oslojs/crypto/subtle';
import { encodeBase32LowerCaseNoPadding, encodeHexLowerCase } from '@oslojs/encoding';
import { and, eq, ne } from 'drizzle-orm';
import { config } from '../config';
import { db } from '../db';
import { session, user } from '../db/schema';
import { sessionAbsoluteDays } from './session-settings';

export const SESSION_COOKIE_NAME = 'brothwright_session';
const TOKEN_BYTES = 20;
/** 20 bytes in lower-case base32 without padding: 32 characters from a–z and 2–7. */
const TOKEN_SHAPE = /^[a-z2-7]{32}$/;
const HOUR_MS = 60 * 60 * 1000;
const DAY_MS = 24 * HOUR_MS;

export type Session = typeof session.$inferSelect;
export interface IssuedSession {
	token: string;
	session: Session;
}
export interface ValidatedSession {
	session: Session;
	user: { id: string; email: string; name: string; active: boolean };
	/** The idle limit was just moved on: the cookie must be sent again with the new expiry. */
	fresh: boolean;
}

export function generateSessionToken(): string {
	const bytes = new Uint8Array(TOKEN_BYTES);
	crypto.getRandomValues(bytes);
	return encodeBase32LowerCaseNoPadding(bytes);
}

/** The id a token is stored under: hex SHA-256 of the token. */
export function sessionIdOf(token: string): string {
	return encodeHexLowerCase(sha256(new TextEncoder().encode(token)));
}

function idleMs(): number {
	return config.sessionIdleHours * HOUR_MS;
}

function absoluteEndOf(createdAt: Date): Date {
	return new Date(createdAt.getTime() + sessionAbsoluteDays() * DAY_MS);
}

/** The idle limit from `now`, never past the absolute limit. */
function idleEnd(createdAt: Date, now: Date): Date {
	return new Date(Math.min(now.getTime() + idleMs(), absoluteEndOf(createdAt).getTime()));
}

export function createSession(userId: string, now = new Date()): IssuedSession {
	const token = generateSessionToken();
	const row: Session = {
		id: sessionIdOf(token),
		userId,
		createdAt: now,
		expiresAt: idleEnd(now, now)
	};
	db.insert(session).values(row).run();
	return { token, session: row };
}

/**
 * The session a presented token opens, or null. A session past its idle or its absolute limit is
 * deleted; one with less than half its idle span left is extended, as sessions were before.
 */
export function validateSessionToken(token: string, now = new Date()): ValidatedSession | null {
	if (!TOKEN_SHAPE.test(token)) return null;
	const sessionId = sessionIdOf(token);
	const row = db
		.select({
			session,
			user: { id: user.id, email: user.email, name: user.name, active: user.active }
		})
		.from(session)
		.innerJoin(user, eq(session.userId, user.id))
		.where(eq(session.id, sessionId))
		.get();
	if (!row || !sameSecret(row.session.id, sessionId)) return null;
	const found = row.session;
	const nowMs = now.getTime();
	if (nowMs >= found.expiresAt.getTime() || nowMs >= absoluteEndOf(found.createdAt).getTime()) {
		invalidateSession(found.id);
		return null;
	}
	let fresh = false;
	if (found.expiresAt.getTime() - nowMs < idleMs() / 2) {
		const expiresAt = idleEnd(found.createdAt, now);
		if (expiresAt.getTime() > found.expiresAt.getTime()) {
			db.update(session).set({ expiresAt }).where(eq(session.id, found.id)).run();
			found.expiresAt = expiresAt;
			fresh = true;
		}
	}
	return { session: found, user: row.user, fresh };
}

function sameSecret(a: string, b: string): boolean {
	const encoder = new TextEncoder();
	return constantTimeEqual(encoder.encode(a), encoder.encode(b));
}

export function invalidateSession(sessionId: string): void {
	db.delete(session).where(eq(session.id, sessionId)).run();
}

export function invalidateUserSessions(userId: string): void {
	db.delete(session).where(eq(session.userId, userId)).run();
}

/** Ends every session of the person except the one they are using; returns how many ended. */
export function invalidateOtherSessions(
	userId: string,
	keepSessionId: string,
	tx: Pick<typeof db, 'delete'> = db
): number {
	return tx
		.delete(session)
		.where(and(eq(session.userId, userId), ne(session.id, keepSessionId)))
		.run().changes;
}

const cookieAttributes = () =>
	({ httpOnly: true, secure: config.secureCookies, sameSite: 'lax', path: '/' }) as const;

export function setSessionCookie(cookies: Cookies, token: string, expiresAt: Date): void {
	cookies.set(SESSION_COOKIE_NAME, token, { ...cookieAttributes(), expires: expiresAt });
}

export function deleteSessionCookie(cookies: Cookies): void {
	cookies.set(SESSION_COOKIE_NAME, '', { ...cookieAttributes(), maxAge: 0 });
}
