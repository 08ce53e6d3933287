import { describe, expect, it } from 'vitest';
import { isExpired } from '$lib/inventory';
import { seedDemo } from '$lib/server/demo/seed';
import { componentsBelowReorder, expiringLots } from '$lib/server/inventory/alerts';
import { ledgerSums } from '$lib/server/inventory/ledger';
import { listLots } from '$lib/server/inventory/lot-list';
import { batchesUsingLot } from '$lib/server/inventory/where-used';
import { listBatchesPage } from '$lib/server/batches/batch-list';
import { findLot } from '$lib/server/inventory/lots';
import { signaturesFor } from '$lib/server/signatures';

describe('the demo inventory', () => {
	it('has an expired lot, one in quarantine, one low on stock, and batches that used lots; seeding twice adds nothing', async () => {
		await seedDemo();
		const lots = listLots();
		expect(lots.some((l) => isExpired(l.expiresOn))).toBe(true);
		expect(lots.some((l) => l.status === 'quarantine')).toBe(true);
		expect(componentsBelowReorder().map((c) => c.componentId)).toContain(
			'magnesium-sulfate-heptahydrate'
		);
		expect(expiringLots(30).total).toBeGreaterThan(0);
		const batches = listBatchesPage(
			{},
			{ page: 1, limit: 200, sort: 'plannedOn', dir: 'desc' }
		).rows;
		expect(batches.map((b) => b.state).sort()).toEqual(['planned', 'released', 'released']);
		// The trace stock made in the demo is a lot the medium batch took its dose from.
		const traceStock = lots.find((l) => l.componentName === 'PPN Trace Elements T2')!;
		expect(traceStock.componentId).toBeNull();
		expect(batchesUsingLot(traceStock.id).map((u) => u.recipeName)).toEqual(['NB-Min Salts 3']);
		const used = lots.filter((l) => batchesUsingLot(l.id).some((u) => u.state === 'released'));
		expect(used.length).toBeGreaterThan(3);
		for (const { lotId, total } of ledgerSums())
			expect(lots.find((l) => l.id === lotId)?.onHand).toBe(total);
		expect(await seedDemo()).toBe(0);
	});

	it('has released and rejected lots, each signed by someone other than its receiver', async () => {
		await seedDemo();
		const decided = listLots().filter((l) => l.status !== 'quarantine');
		expect(new Set(decided.map((l) => l.status))).toEqual(new Set(['released', 'rejected']));
		const signatures = signaturesFor(
			'lot',
			decided.map((l) => l.id)
		);
		for (const l of decided) {
			const made = findLot(l.id)!.sourceBatchId;
			if (made) {
				// A stock made here is released by its batch's review signature, not the preparer's.
				const review = signaturesFor('batch', [made]).find(
					(s) => s.meaning === 'reviewed and released for use'
				);
				expect(review?.signerId).not.toBe(findLot(l.id)?.receivedById);
				continue;
			}
			const signed = signatures.filter((s) => s.subjectId === l.id);
			expect(signed.map((s) => s.meaning)).toEqual([
				l.status === 'released' ? 'released for use' : 'rejected'
			]);
			expect(signed[0].signerId).not.toBe(findLot(l.id)?.receivedById);
			expect(signed[0].subjectDigest).toMatch(/^[0-9a-f]{64}$/);
		}
	});
});
