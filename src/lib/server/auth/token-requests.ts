// The rules of making a token, for the personal tokens page and the service tokens page.
import { z } from 'zod';
import { isAct, type Act } from '$lib/permissions';
import { ROLE_LABELS, ROLES, type Role } from '$lib/roles';
import { ACT_LABELS } from '$lib/token-scopes';
import type { Actor } from '../audit';
import { config } from '../config';
import { db } from '../db';
import { user, userRole } from '../db/schema';
import { RuleError } from '../rule-error';
import { expiryFrom, issueToken, liveTokenCount, MAX_TOKEN_DAYS } from './api-tokens';
import { scopesAllowedFor } from './token-scope-choices';

/** Service accounts hold working roles only: administration stays with people. */
export const SERVICE_ROLES: readonly Role[] = ROLES.filter((r) => r !== 'admin');
export const MAX_REQUESTS_PER_MINUTE = 6000;

const wholeNumber = (label: string, min: number, max: number) =>
	z.coerce
		.number({ error: `${label} must be a whole number.` })
		.int(`${label} must be a whole number.`)
		.min(min, `${label} is at least ${min}.`)
		.max(max, `${label} is at most ${max}.`);

const tokenFields = {
	name: z
		.string()
		.trim()
		.min(1, 'Name the token after what will use it (e.g. “ELN export”).')
		.max(80, 'Name is at most 80 characters.'),
	scopes: z
		.array(z.string())
		.min(1, 'Choose at least one scope: a token without one can do nothing.'),
	expiresInDays: wholeNumber('Expires after (days)', 1, MAX_TOKEN_DAYS)
};

export const personalTokenForm = z.object(tokenFields);

export const serviceTokenForm = z.object({
	...tokenFields,
	roles: z.array(z.string()).min(1, 'Choose at least one role for the service account.'),
	requestsPerMinute: wholeNumber('Requests a minute', 1, MAX_REQUESTS_PER_MINUTE)
});

/** The chosen scopes, each one the roles allow; anything else is refused by name. */
function checkedScopes(chosen: string[], roles: readonly Role[]): Act[] {
	const allowed = scopesAllowedFor(roles);
	const refused = chosen.filter((s) => !isAct(s) || !allowed.includes(s));
	if (refused.length)
		throw new RuleError(
			`Not a scope these roles may give a token: ${refused.join(', ')}. Choose among ${allowed.map((a) => ACT_LABELS[a]).join('; ')}.`,
			{ field: 'scopes' }
		);
	return [...new Set(chosen as Act[])];
}

/** A personal token for the person in hand, within the number one person may hold. */
export function createPersonalToken(
	person: Actor & { id: string; roles: Role[] },
	input: z.infer<typeof personalTokenForm>
): string {
	const scopes = checkedScopes(input.scopes, person.roles);
	const limit = config.apiTokensPerPerson;
	if (liveTokenCount(person.id) >= limit)
		throw new RuleError(
			`You hold ${limit} live tokens, the most one person may. Revoke one you no longer use first.`,
			{ field: 'name', status: 409 }
		);
	return issueToken(person, {
		kind: 'personal',
		name: input.name,
		userId: person.id,
		scopes,
		expiresAt: expiryFrom(input.expiresInDays),
		requestsPerMinute: config.apiTokenRequestsPerMinute
	});
}

/** A service token, with the service account it acts as (no password: it never signs in or signs). */
export function createServiceToken(
	admin: Actor & { id: string },
	input: z.infer<typeof serviceTokenForm>
): string {
	const refusedRoles = input.roles.filter((r) => !SERVICE_ROLES.includes(r as Role));
	if (refusedRoles.length)
		throw new RuleError(
			`A service account may hold ${SERVICE_ROLES.map((r) => ROLE_LABELS[r]).join(', ')}; not ${refusedRoles.join(', ')}.`,
			{ field: 'roles' }
		);
	const roles = [...new Set(input.roles as Role[])];
	const scopes = checkedScopes(input.scopes, roles);
	const accountId = crypto.randomUUID();
	db.transaction((tx) => {
		tx.insert(user)
			.values({
				id: accountId,
				email: `service-${accountId.slice(0, 8)}@tokens.invalid`,
				name: `Service: ${input.name}`,
				passwordHash: '',
				kind: 'service'
			})
			.run();
		for (const role of roles) tx.insert(userRole).values({ userId: accountId, role }).run();
	});
	return issueToken(admin, {
		kind: 'service',
		name: input.name,
		userId: accountId,
		scopes,
		expiresAt: expiryFrom(input.expiresInDays),
		requestsPerMinute: input.requestsPerMinute
	});
}
