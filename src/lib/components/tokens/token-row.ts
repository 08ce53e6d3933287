import type { Act } from '$lib/permissions';

export interface TokenRow {
	id: string;
	name: string;
	/** whose it is: the person, or the service account with its roles */
	holder?: string;
	scopes: Act[];
	createdAt: Date;
	expiresAt: Date;
	lastUsedAt: Date | null;
	revokedAt: Date | null;
	requestsPerMinute: number;
}
