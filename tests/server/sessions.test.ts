import { createHash } from 'node:crypto';
import { eq } from 'drizzle-orm';
import { describe, expect, it } from 'vitest';
import {
	createSession,
	invalidateSession,
	sessionIdOf,
	validateSessionToken
} from '$lib/server/auth/sessions';
import {
	DEFAULT_SESSION_ABSOLUTE_DAYS,
	sessionAbsoluteDays,
	setSessionAbsoluteDays
} from '$lib/server/auth/session-settings';
import { signIn } from '$lib/server/auth/sign-in';
import { config } from '$lib/server/config';
import { db } from '$lib/server/db';
import { auditEvent, session } from '$lib/server/db/schema';
import { makeUser, refusalOf } from './helpers';

const HOUR_MS = 3_600_000;
const DAY_MS = 24 * HOUR_MS;
const idleMs = () => config.sessionIdleHours * HOUR_MS;
const at = (start: Date, ms: number) => new Date(start.getTime() + ms);
const storedRow = (id: string) => db.select().from(session).where(eq(session.id, id)).get();

describe('session tokens', () => {
	it('stores the SHA-256 of the token, never the token itself', async () => {
		const person = await makeUser();
		const signedIn = await signIn(person.email, person.password, '127.0.0.1');
		if (!signedIn.ok) throw new Error('sign-in failed');
		const { token } = signedIn.issued;
		// Independent computation of the hash with node:crypto.
		const expectedId = createHash('sha256').update(token).digest('hex');
		expect(sessionIdOf(token)).toBe(expectedId);
		expect(storedRow(expectedId)?.userId).toBe(person.id);
		expect(storedRow(token)).toBeUndefined();
		const rows = db.select().from(session).where(eq(session.userId, person.id)).all();
		expect(rows.map((r) => r.id)).toEqual([expectedId]);
		// 20 random bytes in base32: 32 characters, different every time.
		expect(token).toMatch(/^[a-z2-7]{32}$/);
		expect(createSession(person.id).token).not.toBe(token);
	});

	it('opens only its own session: another session’s id, a tampered or an ended token is refused', async () => {
		const first = await makeUser();
		const second = await makeUser();
		const a = createSession(first.id);
		const b = createSession(second.id);
		expect(validateSessionToken(a.token)?.user.id).toBe(first.id);
		expect(validateSessionToken(b.token)?.user.id).toBe(second.id);
		// The stored id is not a token: presenting it opens nothing.
		expect(validateSessionToken(a.session.id)).toBeNull();
		const last = a.token.at(-1) === 'a' ? 'b' : 'a';
		expect(validateSessionToken(a.token.slice(0, -1) + last)).toBeNull();
		expect(validateSessionToken(a.token + 'a')).toBeNull();
		expect(validateSessionToken('')).toBeNull();
		invalidateSession(a.session.id);
		expect(validateSessionToken(a.token)).toBeNull();
		expect(validateSessionToken(b.token)?.user.id).toBe(second.id);
	});
});

describe('session limits', () => {
	it('ends a session unused for SESSION_IDLE_HOURS and extends one in use', async () => {
		const person = await makeUser();
		const start = new Date('2026-06-01T08:00:00Z');
		const idle = createSession(person.id, start);
		expect(idle.session.expiresAt.getTime()).toBe(start.getTime() + idleMs());
		expect(validateSessionToken(idle.token, at(start, idleMs() + 1000))).toBeNull();
		expect(storedRow(idle.session.id)).toBeUndefined();

		const used = createSession(person.id, start);
		const early = validateSessionToken(used.token, at(start, idleMs() * 0.25));
		expect(early?.fresh).toBe(false);
		const midway = validateSessionToken(used.token, at(start, idleMs() * 0.75));
		expect(midway?.fresh).toBe(true);
		expect(midway?.session.expiresAt.getTime()).toBe(start.getTime() + idleMs() * 1.75);
		// Past the first idle limit, still open because it was used.
		expect(validateSessionToken(used.token, at(start, idleMs() * 1.5))).not.toBeNull();
		expect(storedRow(used.session.id)?.expiresAt.getTime()).toBeGreaterThan(
			start.getTime() + idleMs()
		);
	});

	it('ends a session at the absolute limit however often it is used', async () => {
		const person = await makeUser();
		expect(sessionAbsoluteDays()).toBe(DEFAULT_SESSION_ABSOLUTE_DAYS);
		const start = new Date('2026-06-01T08:00:00Z');
		const end = at(start, DEFAULT_SESSION_ABSOLUTE_DAYS * DAY_MS);
		const issued = createSession(person.id, start);
		// In use every few hours: the idle limit keeps moving, but never past the absolute one.
		let now = start;
		while (now.getTime() + idleMs() / 2 < end.getTime()) {
			now = at(now, idleMs() * 0.6);
			if (now >= end) break;
			const open = validateSessionToken(issued.token, now);
			expect(open).not.toBeNull();
			expect(open!.session.expiresAt.getTime()).toBeLessThanOrEqual(end.getTime());
		}
		// Rows moved by hand: a far idle limit does not outlast the absolute one.
		db.update(session)
			.set({ expiresAt: at(end, DAY_MS) })
			.where(eq(session.id, issued.session.id))
			.run();
		expect(validateSessionToken(issued.token, at(end, -1000))).not.toBeNull();
		expect(validateSessionToken(issued.token, end)).toBeNull();
		expect(storedRow(issued.session.id)).toBeUndefined();
	});

	it('a shorter absolute limit applies to sessions already open', async () => {
		const admin = await makeUser(['admin']);
		const person = await makeUser();
		const start = new Date('2026-06-01T08:00:00Z');
		const issued = createSession(person.id, start);
		db.update(session)
			.set({ expiresAt: at(start, 10 * DAY_MS) })
			.where(eq(session.id, issued.session.id))
			.run();
		setSessionAbsoluteDays(admin, '2');
		try {
			expect(validateSessionToken(issued.token, at(start, 2 * DAY_MS - 1000))).not.toBeNull();
			expect(validateSessionToken(issued.token, at(start, 2 * DAY_MS + 1000))).toBeNull();
		} finally {
			setSessionAbsoluteDays(admin, String(DEFAULT_SESSION_ABSOLUTE_DAYS));
		}
	});
});

describe('the absolute limit setting', () => {
	it('refuses what is not a whole number of days from 1 to 90, naming the field', async () => {
		const admin = await makeUser(['admin']);
		for (const bad of ['0', '91', '2.5', 'week', '', '-3']) {
			const refusal = await refusalOf(() => setSessionAbsoluteDays(admin, bad));
			// Text that is not a number at all gets the number reader's own reason.
			expect(refusal.message).toMatch(
				/^Longest session \(days\)(: (“week” is not a number|enter a number)| must be a whole number from 1 to 90)/
			);
			expect(refusal.field).toBe('sessionAbsoluteDays');
		}
		expect(sessionAbsoluteDays()).toBe(DEFAULT_SESSION_ABSOLUTE_DAYS);
	});

	it('saves a good value and audits the change', async () => {
		const admin = await makeUser(['admin']);
		setSessionAbsoluteDays(admin, ' 14 ');
		try {
			expect(sessionAbsoluteDays()).toBe(14);
			const audited = db
				.select()
				.from(auditEvent)
				.where(eq(auditEvent.action, 'settings.session_absolute_days'))
				.all()
				.find((e) => e.actorId === admin.id);
			expect(audited?.detail).toEqual({ from: DEFAULT_SESSION_ABSOLUTE_DAYS, to: 14 });
		} finally {
			setSessionAbsoluteDays(admin, String(DEFAULT_SESSION_ABSOLUTE_DAYS));
		}
	});
});
