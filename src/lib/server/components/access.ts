import type { Role } from '$lib/roles';
import { clientAddress, requireRole } from '../guard';

export const COMPONENT_EDITORS = ['media_scientist', 'inventory_lead'] as const satisfies readonly Role[];

export function requireComponentEditor() {
	const user = requireRole(...COMPONENT_EDITORS);
	return { id: user.id, email: user.email, address: clientAddress() };
}
