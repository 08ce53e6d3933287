import { ACTS, may, type Act } from '$lib/permissions';
import type { Role } from '$lib/roles';
import { isTokenScope } from '$lib/token-scopes';
import { allOperations } from '../api/openapi';

/** The scopes a holder of these roles may give a token, in the permission table's order: acts some
 * API operation needs (a scope outside them would grant nothing), less those a token never holds. */
export function scopesAllowedFor(roles: readonly Role[]): Act[] {
	const used = new Set(allOperations().map((op) => op.act));
	return ACTS.filter((act) => used.has(act) && isTokenScope(act) && may(roles, act));
}
