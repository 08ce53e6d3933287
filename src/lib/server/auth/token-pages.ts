// What the two token pages share: the rows they list and the revoke action's rule.
import { describeRoles } from '$lib/roles';
import type { TokenRow } from '$lib/components/tokens/token-row';
import type { Actor } from '../audit';
import { RuleError } from '../rule-error';
import { findToken, revokeToken, type ListedToken } from './api-tokens';
import type { ApiToken } from '../db/schema';

export function tokenRow(t: ApiToken | ListedToken): TokenRow {
	return {
		id: t.id,
		name: t.name,
		holder:
			'ownerName' in t
				? t.kind === 'service'
					? `Acts as ${t.ownerName} (${describeRoles(t.roles)})`
					: `${t.ownerName} (${t.ownerEmail})`
				: undefined,
		scopes: t.scopes,
		createdAt: t.createdAt,
		expiresAt: t.expiresAt,
		lastUsedAt: t.lastUsedAt,
		revokedAt: t.revokedAt,
		requestsPerMinute: t.requestsPerMinute
	};
}

/** Revokes a token the actor may end: their own (`ownerId`), or any (an administrator, no owner). */
export function revokeFromForm(
	actor: Actor & { id: string },
	formData: FormData,
	ownerId: string | null
): string {
	const id = String(formData.get('id') ?? '');
	const reason = String(formData.get('reason') ?? '').trim();
	const token = findToken(id);
	if (!token || (ownerId !== null && (token.userId !== ownerId || token.kind !== 'personal')))
		throw new RuleError('No such token of yours.', { status: 404 });
	if (!reason) throw new RuleError('Say why the token is revoked.', { field: 'reason' });
	revokeToken(actor, id, reason);
	return token.name;
}
