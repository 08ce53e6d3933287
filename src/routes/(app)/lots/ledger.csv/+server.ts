import { error } from '@sveltejs/kit';
import { csvStreamDownload } from '$lib/server/csv-export';
import { requirePermission } from '$lib/server/guard';
import { ledgerExport } from '$lib/server/inventory/csv';
import { findLot } from '$lib/server/inventory/lots';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = async ({ url }) => {
	requirePermission('lot.view');
	const lotId = url.searchParams.get('lot');
	if (lotId) {
		const lot = findLot(lotId);
		if (!lot) error(404, { message: 'No lot with this id.' });
		return csvStreamDownload(ledgerExport(lot.id), `ledger-${lot.code}.csv`);
	}
	return csvStreamDownload(ledgerExport(), `ledger-${new Date().toISOString().slice(0, 10)}.csv`);
};
