import fc from 'fast-check';
import { eq, sql } from 'drizzle-orm';
import { beforeAll, describe, expect, it } from 'vitest';
import { seedReferenceLibrary } from '$lib/server/components/reference-library';
import { db } from '$lib/server/db';
import { stockEntry } from '$lib/server/db/schema';
import { appendStockEntry, ledgerOf, onHandOf } from '$lib/server/inventory/ledger';
import { adjustLot, disposeLot } from '$lib/server/inventory/lots';
import { RuleError } from '$lib/server/rule-error';
import { makeLead, makeLot } from './inventory-fixtures';

let lead: Awaited<ReturnType<typeof makeLead>>;
beforeAll(async () => {
	seedReferenceLibrary();
	lead = await makeLead();
});

type Op =
	| { kind: 'consume'; mg: number }
	| { kind: 'adjust'; direction: 'add' | 'remove'; g: number }
	| { kind: 'dispose'; g: number }
	| { kind: 'disposeAll' };

const op: fc.Arbitrary<Op> = fc.oneof(
	fc.record({ kind: fc.constant('consume' as const), mg: fc.integer({ min: 1, max: 60_000 }) }),
	fc.record({
		kind: fc.constant('adjust' as const),
		direction: fc.constantFrom('add' as const, 'remove' as const),
		g: fc.integer({ min: 1, max: 40 })
	}),
	fc.record({ kind: fc.constant('dispose' as const), g: fc.integer({ min: 1, max: 50 }) }),
	fc.constant({ kind: 'disposeAll' as const })
);

function apply(lotId: string, o: Op): void {
	if (o.kind === 'consume')
		db.transaction((tx) =>
			appendStockEntry(tx, {
				lotId,
				kind: 'consumption',
				quantity: -o.mg,
				reason: 'property test',
				actorId: lead.id
			})
		);
	else if (o.kind === 'adjust')
		adjustLot(lead.actor, lotId, {
			direction: o.direction,
			amount: o.g,
			unit: 'g',
			reason: 'count correction'
		});
	else if (o.kind === 'dispose')
		disposeLot(lead.actor, lotId, { all: false, amount: o.g, unit: 'g', reason: 'spilt' });
	else disposeLot(lead.actor, lotId, { all: true, reason: 'end of life' });
}

describe('the stock ledger', () => {
	it('keeps on-hand equal to the sum of the ledger and never below zero, under random operations', () => {
		fc.assert(
			fc.property(fc.array(op, { minLength: 1, maxLength: 25 }), (ops) => {
				const lot = makeLot(lead.actor, { quantity: '100', unit: 'g' });
				let expected = 100_000;
				for (const o of ops) {
					const before = ledgerOf(lot.id).length;
					let delta: number;
					if (o.kind === 'consume') delta = -o.mg;
					else if (o.kind === 'adjust') delta = (o.direction === 'add' ? 1 : -1) * o.g * 1000;
					else if (o.kind === 'dispose') delta = -o.g * 1000;
					else delta = -expected;
					const allowed = expected + delta >= 0 && delta !== 0;
					try {
						apply(lot.id, o);
						expect(allowed).toBe(true);
						expected += delta;
					} catch (cause) {
						expect(cause).toBeInstanceOf(RuleError);
						expect(allowed).toBe(false);
						expect(ledgerOf(lot.id).length).toBe(before);
					}
					const sum = ledgerOf(lot.id).reduce((s, e) => s + e.quantity, 0);
					expect(onHandOf(lot.id)).toBe(sum);
					expect(sum).toBe(expected);
					expect(sum).toBeGreaterThanOrEqual(0);
				}
			}),
			{ numRuns: 40 }
		);
	});

	it('is enforced by the database too: an insert that goes negative, an update and a delete are refused', () => {
		const lot = makeLot(lead.actor, { quantity: '1', unit: 'g' });
		expect(() =>
			db
				.insert(stockEntry)
				.values({ lotId: lot.id, kind: 'consumption', quantity: -1001, actorId: lead.id })
				.run()
		).toThrow(/negative/);
		expect(() =>
			db.update(stockEntry).set({ quantity: 5 }).where(eq(stockEntry.lotId, lot.id)).run()
		).toThrow(/append-only/);
		expect(() => db.delete(stockEntry).where(eq(stockEntry.lotId, lot.id)).run()).toThrow(
			/append-only/
		);
		expect(() =>
			db
				.insert(stockEntry)
				.values({ lotId: lot.id, kind: 'receipt', quantity: -5, actorId: lead.id })
				.run()
		).toThrow(/sign/);
		expect(() =>
			db
				.insert(stockEntry)
				.values({ lotId: lot.id, kind: 'adjustment', quantity: 5, reason: ' ', actorId: lead.id })
				.run()
		).toThrow(/reason/);
		const total = db
			.select({ t: sql<number>`sum(quantity)` })
			.from(stockEntry)
			.where(eq(stockEntry.lotId, lot.id))
			.get()!.t;
		expect(total).toBe(1000);
	});

	it('refuses taking more than is on hand with a message that names the lot and the amounts', () => {
		const lot = makeLot(lead.actor, { quantity: '2', unit: 'g' });
		expect(() =>
			disposeLot(lead.actor, lot.id, { all: false, amount: 3, unit: 'g', reason: 'test' })
		).toThrow(
			`Lot ${lot.code} has 2 g on hand; taking 3 g would make it negative. Nothing was taken.`
		);
	});
});
