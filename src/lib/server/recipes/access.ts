import { RECIPE_EDITORS } from '$lib/recipes';
import type { Role } from '$lib/roles';
import { RuleError } from '../rule-error';
import type { Actor } from '../audit';
import { clientAddress, requireRole, type SignedInUser } from '../guard';

export { RECIPE_EDITORS };

export function actorOf(user: SignedInUser): Actor & { id: string; email: string; address: string; roles: Role[] } {
	return { id: user.id, email: user.email, address: clientAddress(), roles: user.roles };
}

/** The request's user, who must be allowed to write drafts. */
export function requireRecipeEditor() {
	return actorOf(requireRole(...RECIPE_EDITORS));
}

export function versionNumber(raw: string): number {
	const n = Number(raw);
	if (!Number.isInteger(n) || n < 1) throw new RuleError(`“${raw}” is not a version number.`, { status: 404 });
	return n;
}
