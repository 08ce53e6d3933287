import { z } from 'zod';
import { ROLES } from '$lib/roles';

/** A checkbox group of roles, as parseForm delivers it (an array, possibly empty). */
export const rolesField = z
	.array(z.enum(ROLES, { error: 'That is not one of the roles.' }))
	.min(1, 'Choose at least one role.');
