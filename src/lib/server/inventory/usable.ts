import { and, eq, gt, gte, isNull, or, type SQL } from 'drizzle-orm';
import { lot } from '../db/schema';

/**
 * `isUsableLot` (released, not expired and not due for retest on `onDate`) as a SQL condition on
 * `lot`: ISO dates compare as text, so "not expired" (`expiresOn < onDate` is false) is
 * `expires_on >= onDate`, and "not due" is no retest date or one after `onDate`.
 */
export function usableLotCondition(onDate: string): SQL {
	return and(
		eq(lot.status, 'released'),
		gte(lot.expiresOn, onDate),
		or(isNull(lot.retestOn), gt(lot.retestOn, onDate))
	)!;
}
