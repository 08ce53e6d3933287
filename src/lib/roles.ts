// Roles are shared by server guards and client navigation, so this module holds no server code.
export const ROLES = [
	'admin',
	'media_scientist',
	'prep_technician',
	'engineer',
	'inventory_lead'
] as const;

export type Role = (typeof ROLES)[number];

export const ROLE_LABELS: Record<Role, string> = {
	admin: 'Administrator',
	media_scientist: 'Media scientist',
	prep_technician: 'Prep technician',
	engineer: 'Process engineer',
	inventory_lead: 'Inventory lead'
};

export interface RoleHolder {
	roles: readonly Role[];
}

/** True when the holder has at least one of `allowed`; an empty list means any signed-in user. */
export function hasRole(holder: RoleHolder | null | undefined, allowed: readonly Role[]): boolean {
	if (!holder) return false;
	if (allowed.length === 0) return true;
	return allowed.some((role) => holder.roles.includes(role));
}

export function isRole(value: string): value is Role {
	return (ROLES as readonly string[]).includes(value);
}

export function describeRoles(roles: readonly Role[]): string {
	return roles.length ? roles.map((r) => ROLE_LABELS[r]).join(', ') : 'no role';
}
