import type { Role } from '$lib/roles';

/** Who may use the simulation pages and keep scenarios. */
export const SIMULATION_ROLES = ['engineer', 'media_scientist'] as const satisfies readonly Role[];
