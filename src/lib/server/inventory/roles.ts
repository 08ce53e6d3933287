import type { Role } from '$lib/roles';

/** Who keeps the stock: receives, releases, rejects, adjusts and disposes of lots. */
export const STOCK_KEEPERS = ['inventory_lead'] as const satisfies readonly Role[];
