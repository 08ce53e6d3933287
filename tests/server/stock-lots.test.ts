// A stock solution made here is a lot: released with its batch, scanned by the stock line of a
// later batch, taken from at completion, and followed by where-used from raw lot to medium.
import { beforeAll, describe, expect, it } from 'vitest';
import { completeBatch } from '$lib/server/batches/completion';
import { recordLine } from '$lib/server/batches/line-record';
import { chooseLot } from '$lib/server/batches/lot-choice';
import { buildSheetLines } from '$lib/server/batches/sheet';
import { DEFAULT_STOCK_SHELF_LIFE_DAYS } from '$lib/server/batches/stock-lots';
import { seedReferenceLibrary } from '$lib/server/components/reference-library';
import { addDays } from '$lib/server/inventory/alerts';
import { ledgerOf, onHandOf } from '$lib/server/inventory/ledger';
import { findLotByCode } from '$lib/server/inventory/lots';
import { listLotsPage } from '$lib/server/inventory/lot-list';
import { db } from '$lib/server/db';
import { component, lot, recipe } from '$lib/server/db/schema';
import { eq, sql } from 'drizzle-orm';
import { batchesMadeFromLot } from '$lib/server/inventory/where-used';
import { makeBatch, stockAndMedium, planBatch } from './batch-fixtures';
import { makeUser } from './helpers';
import { decideLot, makeApprovedRecipe, makeLead, makeLot, today } from './inventory-fixtures';

type Person = Awaited<ReturnType<typeof makeUser>>;
let lead: Awaited<ReturnType<typeof makeLead>>;
let tech: Person;
let reviewer: Person;
let stockRecipe: Awaited<ReturnType<typeof makeApprovedRecipe>>;
let medium: Awaited<ReturnType<typeof makeApprovedRecipe>>;

beforeAll(async () => {
	seedReferenceLibrary();
	lead = await makeLead();
	tech = await makeUser(['prep_technician']);
	reviewer = await makeUser(['engineer']);
	({ stockRecipe, medium } = await stockAndMedium(''));
});

describe('stock solutions made here', () => {
	it('become a lot at release, are scanned by a stock line, and are followed raw lot → stock → medium', async () => {
		const raw = makeLot(lead.actor, {
			component: 'magnesium-sulfate',
			expiresOn: addDays(today, 400),
			quantity: '500',
			unit: 'g'
		});
		const stockBatch = await makeBatch(tech, stockRecipe.recipeId, 0.5, [raw.code], reviewer);
		const stockLot = findLotByCode(stockBatch.number)!;
		expect(stockLot).toMatchObject({
			componentId: null,
			sourceBatchId: stockBatch.id,
			status: 'released',
			quantityKind: 'volume',
			receivedQuantity: 500_000,
			expiresOn: addDays(today, DEFAULT_STOCK_SHELF_LIFE_DAYS)
		});
		expect(onHandOf(stockLot.id)).toBe(500_000);

		const salt = makeLot(lead.actor, { component: 'sodium-chloride', quantity: '100', unit: 'g' });
		const b = planBatch(tech, medium.recipeId, 1);
		const [saltLine, stockLine] = buildSheetLines(b);
		expect(stockLine.suggestion?.code).toBe(stockBatch.number);
		expect(stockLine.requiredText).toBe('2 mL');
		// A raw lot is not the stock; a planned stock batch that was never made is no lot at all.
		expect(() => chooseLot(tech, b.id, stockLine.id, salt.code)).toThrow(
			/Wrong stock: .* this line needs a released batch of/
		);
		const planned = planBatch(tech, stockRecipe.recipeId, 0.5);
		expect(() => chooseLot(tech, b.id, stockLine.id, planned.number)).toThrow(
			/is not a lot known here/
		);
		chooseLot(tech, b.id, saltLine.id, salt.code);
		recordLine(tech, b.id, saltLine.id, { actualText: '5' });
		expect(() => recordLine(tech, b.id, stockLine.id, { actualText: '2' })).toThrow(
			/Scan the stock bottle for line 2 first/
		);
		chooseLot(tech, b.id, stockLine.id, stockBatch.number);
		recordLine(tech, b.id, stockLine.id, { actualText: '2' });
		await completeBatch(tech, b.id, { password: tech.password });
		expect(onHandOf(stockLot.id)).toBe(500_000 - 2_000);
		expect(ledgerOf(stockLot.id).map((e) => [e.kind, e.quantity])).toEqual([
			['receipt', 500_000],
			['consumption', -2_000]
		]);

		const traced = batchesMadeFromLot(raw.id).map((u) => [u.batchNumber, u.depth, u.viaLotCode]);
		expect(traced).toEqual([
			[stockBatch.number, 1, null],
			[b.number, 2, stockBatch.number]
		]);
	});

	it('sort by material: a stock by its recipe’s name, a raw lot by its component’s through a rename', async () => {
		const raw = makeLot(lead.actor, { component: 'magnesium-sulfate' });
		const stockBatch = await makeBatch(tech, stockRecipe.recipeId, 0.5, [raw.code], reviewer);
		const stockCode = findLotByCode(stockBatch.number)!.code;
		const byMaterial = () =>
			listLotsPage({}, { page: 1, limit: 200, sort: 'component', dir: 'asc' }, today).rows;
		const nameOf = (code: string) => byMaterial().find((r) => r.code === code)!.componentName;
		db.update(component)
			.set({ name: 'Zzz magnesium sulfate' })
			.where(eq(component.id, 'magnesium-sulfate'))
			.run();
		const stockName = db.select().from(recipe).where(eq(recipe.id, stockRecipe.recipeId)).get()!
			.name;
		expect(nameOf(stockCode)).toBe(stockName);
		expect(nameOf(raw.code)).toBe('Zzz magnesium sulfate');
		// The order is the material names' own, then the codes (compared independently here).
		const rows = byMaterial();
		const sorted = [...rows].sort((a, b) =>
			a.componentName === b.componentName
				? a.code < b.code
					? -1
					: 1
				: a.componentName < b.componentName
					? -1
					: 1
		);
		expect(rows.map((r) => r.code)).toEqual(sorted.map((r) => r.code));
		expect(rows.at(-1)!.componentName).toBe('Zzz magnesium sulfate');
		// Within one status, from the kept key alone: the same lots the lot table itself holds.
		const quarantined = makeLot(lead.actor, {
			component: 'magnesium-sulfate',
			status: 'quarantine'
		});
		const inQuarantine = listLotsPage(
			{ status: 'quarantine' },
			{ page: 1, limit: 200, sort: 'component', dir: 'asc' },
			today
		);
		const expected = db
			.select({ code: lot.code })
			.from(lot)
			.where(eq(lot.status, 'quarantine'))
			.all();
		expect(inQuarantine.rows.map((r) => r.code).sort()).toEqual(expected.map((r) => r.code).sort());
		expect(inQuarantine.rows.map((r) => r.code)).toContain(quarantined.code);
		decideLot(lead.actor, quarantined.id, 'released', '');
		expect(
			listLotsPage(
				{ status: 'quarantine' },
				{ page: 1, limit: 200, sort: 'component', dir: 'asc' },
				today
			).rows.map((r) => r.code)
		).not.toContain(quarantined.code);
		// Every lot's kept key is the one worked out from its component or recipe, and its status, now.
		const stale = db.all(
			sql.raw(
				`select l.code from lot l join lot_list_key k on k.lot_id = l.id
				 where k.status <> l.status or k.code <> l.code or k.material_name <> coalesce(
				   (select c.name from component c where c.id = l.component_id),
				   (select r.name from recipe r join batch b on b.recipe_id = r.id where b.id = l.source_batch_id), l.code)`
			)
		);
		expect(stale).toEqual([]);
		expect(db.all(sql.raw('select count(*) n from lot_list_key'))).toEqual(
			db.all(sql.raw('select count(*) n from lot'))
		);
	});
});
