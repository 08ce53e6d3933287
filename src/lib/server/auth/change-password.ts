import { and, eq, isNull } from 'drizzle-orm';
import { recordAudit, type Actor } from '../audit';
import { db } from '../db';
import { passwordReset, user } from '../db/schema';
import { RuleError } from '../rule-error';
import { checkPasswordPolicy } from './password-policy';
import { checkCountedPassword } from './password-check';
import { hashPassword } from './passwords';
import { invalidateOtherSessions } from './sessions';

export interface PasswordChanger {
	id: string;
	email: string;
	name: string;
	passwordHash: string;
}

const UNCHANGED = 'Your password is unchanged.';

/** The current password, counted with the person's sign-in tries so it cannot be guessed here. */
async function checkCurrentPassword(person: PasswordChanger, password: string, actor: Actor) {
	const refuse = (reason: string) =>
		recordAudit(actor, {
			action: 'password.change_refused',
			subjectType: 'user',
			subjectId: person.id,
			detail: { reason }
		});
	await checkCountedPassword(person, password, actor.address ?? null, refuse, {
		field: 'currentPassword',
		wrong: `The current password is not right. ${UNCHANGED}`,
		held: UNCHANGED
	});
}

/**
 * A signed-in person sets a new password. The old one is required; every other session of theirs
 * ends and any reset link still open is voided, so whoever held the old password is shut out.
 */
export async function changeOwnPassword(
	person: PasswordChanger,
	input: { currentPassword: string; newPassword: string },
	keep: { sessionId: string; address: string | null }
): Promise<{ sessionsEnded: number }> {
	const actor: Actor = { id: person.id, email: person.email, address: keep.address };
	await checkCurrentPassword(person, input.currentPassword, actor);
	if (input.newPassword === input.currentPassword) {
		throw new RuleError(`The new password is the same as the current one; choose another.`, {
			field: 'password'
		});
	}
	const problem = checkPasswordPolicy(input.newPassword, [person.name, person.email]);
	if (problem) throw new RuleError(problem, { field: 'password' });
	const passwordHash = await hashPassword(input.newPassword);
	const now = new Date();
	return db.transaction((tx) => {
		tx.update(user).set({ passwordHash }).where(eq(user.id, person.id)).run();
		tx.update(passwordReset)
			.set({ usedAt: now })
			.where(and(eq(passwordReset.userId, person.id), isNull(passwordReset.usedAt)))
			.run();
		const sessionsEnded = invalidateOtherSessions(person.id, keep.sessionId, tx);
		recordAudit(
			actor,
			{
				action: 'password.changed',
				subjectType: 'user',
				subjectId: person.id,
				detail: { sessionsEnded }
			},
			tx
		);
		return { sessionsEnded };
	});
}
