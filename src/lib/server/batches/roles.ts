import type { Role } from '$lib/roles';

export const BATCH_PLANNERS = ['prep_technician', 'media_scientist', 'engineer'] as const satisfies readonly Role[];
export const BATCH_PREPARERS = ['prep_technician'] as const satisfies readonly Role[];
export const BATCH_REVIEWERS = ['media_scientist', 'engineer'] as const satisfies readonly Role[];
