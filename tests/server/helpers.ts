import type { Role } from '$lib/roles';
import { RuleError } from '$lib/server/rule-error';
import { createUser } from '$lib/server/people';

let counter = 0;

/** A real account in this test file's SQLite database. */
export async function makeUser(
	roles: Role[] = ['engineer'],
	password = 'correct-horse-battery-42'
) {
	counter++;
	const email = `person${counter}-${crypto.randomUUID().slice(0, 6)}@lab.test`;
	const id = await createUser({ email, name: `Person ${counter}`, password, roles });
	return { id, email, password, roles };
}

/** The rule refusal a call ends in (sync or async); fails the test when it succeeds or throws otherwise. */
export async function refusalOf(run: () => unknown): Promise<RuleError> {
	try {
		await run();
	} catch (error) {
		if (error instanceof RuleError) return error;
		throw error;
	}
	throw new Error('expected a refusal');
}
