import { endpoint } from '$lib/server/api/endpoint';
import { parseQuery } from '$lib/server/api/query';
import {
	decodeLedgerCursor,
	ledgerPageQuery,
	lotLedgerPage
} from '$lib/server/inventory/ledger-page';
import { findLot } from '$lib/server/inventory/lots';
import { RuleError } from '$lib/server/rule-error';

export const GET = endpoint({ act: 'lot.view' }, ({ event }) => {
	const query = parseQuery(ledgerPageQuery, event.url);
	const lot = findLot(event.params.id!);
	if (!lot) throw new RuleError('No lot with this id.', { status: 404 });
	return lotLedgerPage(lot.id, {
		before: query.before === undefined ? null : decodeLedgerCursor(query.before),
		limit: query.limit
	});
});
