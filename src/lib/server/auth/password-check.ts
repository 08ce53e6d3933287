import { RuleError } from '../rule-error';
import { verifyPassword } from './passwords';
import { claimAttempt, settleAttempt } from './throttle';

/**
 * A password a person re-enters while signed in (to sign, to witness, to change it): the try is
 * counted with the person's sign-in tries before it is checked, and `refuse` records why it was
 * turned down. Throws a field error (`field`, with `wrong` as its words; a throttled try ends its
 * reason with `held`) unless the password is right.
 */
export async function checkCountedPassword(
	person: { email: string; passwordHash: string },
	password: string,
	address: string | null,
	refuse: (reason: string) => void,
	words: { field: string; wrong: string; held: string }
): Promise<void> {
	const claim = claimAttempt(person.email, address ?? 'unknown');
	if (!claim.allowed) {
		refuse('too many password tries');
		throw new RuleError(`${claim.reason} ${words.held}`, { field: words.field, status: 429 });
	}
	if (!password || !(await verifyPassword(person.passwordHash, password))) {
		refuse('wrong password');
		throw new RuleError(words.wrong, { field: words.field });
	}
	settleAttempt(claim.attemptId);
}
