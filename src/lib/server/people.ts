import { and, asc, eq, gt, isNull } from 'drizzle-orm';
import { describeRoles, type Role } from '$lib/roles';
import { recordAudit, type Actor } from './audit';
import { invalidateUserSessions } from './auth/sessions';
import { checkPasswordPolicy } from './auth/password-policy';
import { claimResetRequest } from './auth/reset-throttle';
import { hashPassword } from './auth/passwords';
import { createLinkToken, hashLinkToken } from './auth/tokens';
import { config } from './config';
import { db } from './db';
import { invitation, passwordReset, user, userRole, type User } from './db/schema';
import { sendMail } from './mail/send';
import { RuleError } from './rule-error';
import { invitationMail, passwordResetMail } from './mail/templates';

export const INVITATION_LIFETIME_MS = 72 * 60 * 60 * 1000;
export const RESET_LIFETIME_MS = 60 * 60 * 1000;

export function normaliseEmail(email: string): string {
	return email.trim().toLowerCase();
}

export function rolesOf(userId: string): Role[] {
	return db
		.select({ role: userRole.role })
		.from(userRole)
		.where(eq(userRole.userId, userId))
		.orderBy(asc(userRole.role))
		.all()
		.map((r) => r.role);
}

export function findUserByEmail(email: string): User | undefined {
	return db
		.select()
		.from(user)
		.where(eq(user.email, normaliseEmail(email)))
		.get();
}

export function findUser(id: string): User | undefined {
	return db.select().from(user).where(eq(user.id, id)).get();
}

export interface PersonRow {
	id: string;
	email: string;
	name: string;
	roles: Role[];
	active: boolean;
	createdAt: Date;
}

export function listPeople(): PersonRow[] {
	const users = db
		.select()
		.from(user)
		.where(eq(user.kind, 'person'))
		.orderBy(asc(user.email))
		.all();
	const roleRows = db.select().from(userRole).all();
	return users.map((u) => ({
		id: u.id,
		email: u.email,
		name: u.name,
		active: u.active,
		createdAt: u.createdAt,
		roles: roleRows.filter((r) => r.userId === u.id).map((r) => r.role)
	}));
}

/** Creates an account directly (demo seed and first admin); people normally arrive by invitation. */
export async function createUser(input: {
	email: string;
	name: string;
	password: string;
	roles: Role[];
}): Promise<string> {
	const passwordHash = await hashPassword(input.password);
	return db.transaction((tx) => {
		const id = crypto.randomUUID();
		tx.insert(user)
			.values({ id, email: normaliseEmail(input.email), name: input.name, passwordHash })
			.run();
		for (const role of input.roles) tx.insert(userRole).values({ userId: id, role }).run();
		return id;
	});
}

export function changeRoles(actor: Actor, userId: string, roles: Role[]): void {
	const target = findUser(userId);
	if (!target) throw new RuleError('No such person.', { status: 404 });
	if (roles.length === 0) throw new RuleError('Choose at least one role.', { field: 'roles' });
	if (actor.id === userId && !roles.includes('admin')) {
		throw new RuleError('You cannot remove your own administrator role.', { field: 'roles' });
	}
	const before = rolesOf(userId);
	db.transaction((tx) => {
		tx.delete(userRole).where(eq(userRole.userId, userId)).run();
		for (const role of roles) tx.insert(userRole).values({ userId, role }).run();
		recordAudit(
			actor,
			{
				action: 'person.roles_changed',
				subjectType: 'user',
				subjectId: userId,
				detail: { email: target.email, before, after: roles }
			},
			tx
		);
	});
}

export async function setActive(actor: Actor, userId: string, active: boolean): Promise<void> {
	const target = findUser(userId);
	if (!target) throw new RuleError('No such person.', { status: 404 });
	if (actor.id === userId && !active) throw new RuleError('You cannot deactivate yourself.');
	if (target.active === active) return;
	db.transaction((tx) => {
		tx.update(user)
			.set({ active, deactivatedAt: active ? null : new Date() })
			.where(eq(user.id, userId))
			.run();
		recordAudit(
			actor,
			{
				action: active ? 'person.reactivated' : 'person.deactivated',
				subjectType: 'user',
				subjectId: userId,
				detail: { email: target.email }
			},
			tx
		);
	});
	// Their sessions end at once, not at the next expiry.
	if (!active) invalidateUserSessions(userId);
}

export interface InvitationOutcome {
	invitationId: string;
	link: string;
	mailError?: string;
}

export async function invitePerson(
	actor: Actor & { name: string },
	input: { email: string; name: string; roles: Role[] },
	now = new Date()
): Promise<InvitationOutcome> {
	const email = normaliseEmail(input.email);
	if (input.roles.length === 0)
		throw new RuleError('Choose at least one role.', { field: 'roles' });
	if (findUserByEmail(email)) {
		throw new RuleError('Someone already has an account with this e-mail address.', {
			field: 'email'
		});
	}
	const { token, tokenHash } = createLinkToken();
	const expiresAt = new Date(now.getTime() + INVITATION_LIFETIME_MS);
	const invitationId = db.transaction((tx) => {
		// A new invitation replaces any earlier one still open for the same address.
		tx.update(invitation)
			.set({ revokedAt: now })
			.where(
				and(
					eq(invitation.email, email),
					isNull(invitation.acceptedAt),
					isNull(invitation.revokedAt)
				)
			)
			.run();
		const id = crypto.randomUUID();
		tx.insert(invitation)
			.values({
				id,
				email,
				name: input.name,
				roles: input.roles,
				tokenHash,
				invitedBy: actor.id!,
				createdAt: now,
				expiresAt
			})
			.run();
		recordAudit(
			actor,
			{
				action: 'person.invited',
				subjectType: 'invitation',
				subjectId: id,
				detail: { email, roles: input.roles }
			},
			tx
		);
		return id;
	});
	const link = `${config.origin}/invite/${token}`;
	try {
		await sendMail(
			invitationMail({
				to: email,
				inviterName: actor.name,
				link,
				expiresAt,
				roles: describeRoles(input.roles)
			})
		);
		return { invitationId, link };
	} catch (cause) {
		return {
			invitationId,
			link,
			mailError: cause instanceof Error ? cause.message : String(cause)
		};
	}
}

export type LinkState = 'valid' | 'expired' | 'used' | 'unknown';

export function inspectInvitation(token: string, now = new Date()) {
	const row = db
		.select()
		.from(invitation)
		.where(eq(invitation.tokenHash, hashLinkToken(token)))
		.get();
	let state: LinkState = 'valid';
	if (!row) state = 'unknown';
	else if (row.acceptedAt || row.revokedAt) state = 'used';
	else if (row.expiresAt.getTime() <= now.getTime()) state = 'expired';
	return { state, invitation: row };
}

export const LINK_MESSAGES: Record<Exclude<LinkState, 'valid'>, string> = {
	unknown: 'This link is not recognised. Check that it was copied whole, or ask for a new one.',
	expired: 'This link has expired. Ask for a new one.',
	used: 'This link has already been used, or was replaced by a newer one. Ask for a new one if you still need it.'
};

export async function acceptInvitation(
	token: string,
	input: { name: string; password: string; address: string },
	now = new Date()
): Promise<string> {
	const { state, invitation: row } = inspectInvitation(token, now);
	if (state !== 'valid' || !row)
		throw new RuleError(LINK_MESSAGES[state as Exclude<LinkState, 'valid'>]);
	const problem = checkPasswordPolicy(input.password, [input.name, row.email]);
	if (problem) throw new RuleError(problem, { field: 'password' });
	if (findUserByEmail(row.email)) {
		throw new RuleError('An account with this e-mail address already exists; sign in instead.');
	}
	const passwordHash = await hashPassword(input.password);
	return db.transaction((tx) => {
		// Claim the invitation first: a second, concurrent use finds it already accepted.
		const claimed = tx
			.update(invitation)
			.set({ acceptedAt: now })
			.where(
				and(eq(invitation.id, row.id), isNull(invitation.acceptedAt), gt(invitation.expiresAt, now))
			)
			.run();
		if (claimed.changes !== 1) throw new RuleError(LINK_MESSAGES.used);
		const userId = crypto.randomUUID();
		tx.insert(user)
			.values({
				id: userId,
				email: row.email,
				name: input.name || row.name || row.email,
				passwordHash
			})
			.run();
		for (const role of row.roles) tx.insert(userRole).values({ userId, role }).run();
		recordAudit(
			{ id: userId, email: row.email, address: input.address },
			{
				action: 'person.invitation_accepted',
				subjectType: 'user',
				subjectId: userId,
				detail: { roles: row.roles }
			},
			tx
		);
		return userId;
	});
}

/**
 * Sends a reset link to an active account. The answer and its time are the same for any address
 * (known or not, active or not): the mail goes out after the answer, so nothing tells which
 * addresses have accounts. A mail that fails is recorded in the trail. Requests are throttled
 * (`claimResetRequest`): too many from one network address are refused, and past a few per e-mail
 * address no more mail goes out, with the same answer.
 */
export function requestPasswordReset(
	email: string,
	address: string,
	now = new Date()
): { mailSent: Promise<void> } {
	const claim = claimResetRequest(normaliseEmail(email), address, now.getTime());
	if (!claim.allowed) throw new RuleError(claim.reason, { field: 'email', status: 429 });
	const target = findUserByEmail(email);
	if (!claim.mayMail) {
		recordAudit(
			{ id: target?.id ?? null, email: normaliseEmail(email), address },
			{
				action: 'password.reset_throttled',
				subjectType: target ? 'user' : undefined,
				subjectId: target?.id
			}
		);
		return { mailSent: Promise.resolve() };
	}
	if (!target || !target.active) {
		recordAudit(
			{ id: null, email: normaliseEmail(email), address },
			{ action: 'password.reset_unknown', detail: { reason: target ? 'deactivated' : 'unknown' } }
		);
		return { mailSent: Promise.resolve() };
	}
	const { token, tokenHash } = createLinkToken();
	const expiresAt = new Date(now.getTime() + RESET_LIFETIME_MS);
	db.transaction((tx) => {
		// A newer link voids the older ones: only the last link sent can set a password.
		tx.update(passwordReset)
			.set({ usedAt: now })
			.where(and(eq(passwordReset.userId, target.id), isNull(passwordReset.usedAt)))
			.run();
		tx.insert(passwordReset)
			.values({ userId: target.id, tokenHash, createdAt: now, expiresAt })
			.run();
		recordAudit(
			{ id: target.id, email: target.email, address },
			{ action: 'password.reset_requested', subjectType: 'user', subjectId: target.id },
			tx
		);
	});
	const link = `${config.origin}/reset/${token}`;
	const mailSent = sendMail(passwordResetMail({ to: target.email, link, expiresAt })).catch(
		(cause: unknown) =>
			recordAudit(
				{ id: target.id, email: target.email, address },
				{
					action: 'password.reset_mail_failed',
					subjectType: 'user',
					subjectId: target.id,
					detail: { problem: cause instanceof Error ? cause.message : String(cause) }
				}
			)
	);
	return { mailSent };
}

export function inspectPasswordReset(token: string, now = new Date()) {
	const row = db
		.select()
		.from(passwordReset)
		.where(eq(passwordReset.tokenHash, hashLinkToken(token)))
		.get();
	let state: LinkState = 'valid';
	if (!row) state = 'unknown';
	else if (row.usedAt) state = 'used';
	else if (row.expiresAt.getTime() <= now.getTime()) state = 'expired';
	return { state, reset: row };
}

export async function completePasswordReset(
	token: string,
	password: string,
	address: string,
	now = new Date()
): Promise<string> {
	const { state, reset } = inspectPasswordReset(token, now);
	if (state !== 'valid' || !reset)
		throw new RuleError(LINK_MESSAGES[state as Exclude<LinkState, 'valid'>]);
	const target = findUser(reset.userId)!;
	const problem = checkPasswordPolicy(password, [target.name, target.email]);
	if (problem) throw new RuleError(problem, { field: 'password' });
	const passwordHash = await hashPassword(password);
	db.transaction((tx) => {
		const claimed = tx
			.update(passwordReset)
			.set({ usedAt: now })
			.where(and(eq(passwordReset.id, reset.id), isNull(passwordReset.usedAt)))
			.run();
		if (claimed.changes !== 1) throw new RuleError(LINK_MESSAGES.used);
		// A completed reset voids every other link still open for the account.
		tx.update(passwordReset)
			.set({ usedAt: now })
			.where(and(eq(passwordReset.userId, reset.userId), isNull(passwordReset.usedAt)))
			.run();
		tx.update(user).set({ passwordHash }).where(eq(user.id, reset.userId)).run();
		recordAudit(
			{ id: target.id, email: target.email, address },
			{ action: 'password.reset_completed', subjectType: 'user', subjectId: target.id },
			tx
		);
	});
	// Anyone holding an old session loses it along with the old password.
	invalidateUserSessions(reset.userId);
	return reset.userId;
}
