import { and, eq, gte, type SQL } from 'drizzle-orm';
import { lot } from '../db/schema';

/**
 * `isUsableLot` (released and not expired on `onDate`) as a SQL condition on `lot`: ISO dates compare
 * as text, so "not expired" (`expiresOn < onDate` is false) is `expires_on >= onDate`.
 */
export function usableLotCondition(onDate: string): SQL {
	return and(eq(lot.status, 'released'), gte(lot.expiresOn, onDate))!;
}
