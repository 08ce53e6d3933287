// `npm run seed:scale`: a database at a real site's size for the list benchmarks: the demo, then
// 100,000 lots with about 480,000 ledger entries, 50,000 batches with their lines, and a trail entry
// per lot and batch, all inserted with every trigger active. Writes SCALE_DATABASE_PATH
// (default ./data/scale.db), replacing it.
import { rmSync } from 'node:fs';
import { resolve } from 'node:path';

const path = resolve(process.env.SCALE_DATABASE_PATH ?? './data/scale.db');
process.env.DATABASE_PATH = path;
process.env.DEMO = '1';
for (const suffix of ['', '-wal', '-shm']) rmSync(`${path}${suffix}`, { force: true });

const { and, eq, sql } = await import('drizzle-orm');
const { getDb } = await import('../lib/server/db');
const { batch, batchLine, lot, stockEntry } = await import('../lib/server/db/schema');
const { seedReferenceLibrary } = await import('../lib/server/components/reference-library');
const { seedDemo } = await import('../lib/server/demo/seed');
const { recordAudit } = await import('../lib/server/audit');
const { cloneRows } = await import('../lib/server/scale/clone-rows');

const LOTS = 100_000;
const BATCHES = 50_000;
/** Entries per lot after its receipt; with it, 4.8 per lot on average as at the measured site. */
const EXTRA_ENTRIES = [1, 1, 1, 0.8] as const;

const db = getDb();
const started = Date.now();
const step = (what: string) =>
	console.log(`${((Date.now() - started) / 1000).toFixed(1).padStart(6)} s  ${what}`);

seedReferenceLibrary();
await seedDemo();
step('demo seeded');

const templateLot = db
	.select({ id: lot.id })
	.from(lot)
	.innerJoin(stockEntry, and(eq(stockEntry.lotId, lot.id), eq(stockEntry.kind, 'receipt')))
	.where(eq(lot.status, 'released'))
	.get()!;
const templateBatch = db
	.select({ id: batch.id })
	.from(batch)
	.where(eq(batch.state, 'released'))
	.get()!;
const componentCount = (db.get(sql.raw('select count(*) as n from component')) as { n: number }).n;

db.transaction((tx) => {
	// As at a site that has received for ten years: lots spread over the whole library, each with
	// two years of shelf life, so most are long expired and about a fifth are in date.
	cloneRows(tx, lot, `t.id = '${templateLot.id}'`, LOTS, {
		id: `'scale-lot-' || n.i`,
		code: `'L-SCALE-' || printf('%06d', n.i)`,
		component_id: `coalesce((select c.id from component c where c.rowid = 1 + n.i % ${componentCount}), t.component_id)`,
		supplier_lot: `'SL-' || n.i`,
		received_on: `date('2017-01-01', '+' || (n.i * 3650 / ${LOTS}) || ' days')`,
		expires_on: `date('2019-01-01', '+' || (n.i * 3650 / ${LOTS}) || ' days')`
	});
	cloneRows(tx, stockEntry, `t.lot_id = '${templateLot.id}' and t.kind = 'receipt'`, LOTS, {
		id: `'scale-receipt-' || n.i`,
		lot_id: `'scale-lot-' || n.i`
	});
	EXTRA_ENTRIES.forEach((share, k) => {
		cloneRows(
			tx,
			stockEntry,
			`t.lot_id = '${templateLot.id}' and t.kind = 'receipt'`,
			Math.round(LOTS * share),
			{
				id: `'scale-entry-${k}-' || n.i`,
				lot_id: `'scale-lot-' || n.i`,
				kind: `'adjustment'`,
				quantity: '-1',
				reason: `'stock count'`
			}
		);
	});
});
step(`${LOTS.toLocaleString('en')} lots and their ledger`);

db.transaction((tx) => {
	cloneRows(tx, batch, `t.id = '${templateBatch.id}'`, BATCHES, {
		id: `'scale-batch-' || n.i`,
		number: `'B-SCALE-' || printf('%06d', n.i)`,
		number_year: '1999',
		number_seq: 'n.i',
		planned_on: `date('2024-01-01', '+' || (n.i % 900) || ' days')`
	});
	cloneRows(tx, batchLine, `t.batch_id = '${templateBatch.id}'`, BATCHES, {
		id: `'scale-line-' || n.i || '-' || t.position`,
		batch_id: `'scale-batch-' || n.i`
	});
});
step(`${BATCHES.toLocaleString('en')} batches and their lines`);

const actor = { id: null, email: 'scale-seed@demo.test', address: '127.0.0.1' };
db.transaction((tx) => {
	for (let i = 1; i <= LOTS; i++)
		recordAudit(
			actor,
			{ action: 'lot.received', subjectType: 'lot', subjectId: `scale-lot-${i}` },
			tx
		);
	for (let i = 1; i <= BATCHES; i++)
		recordAudit(
			actor,
			{ action: 'batch.planned', subjectType: 'batch', subjectId: `scale-batch-${i}` },
			tx
		);
});
step('a trail entry per lot and batch');

const count = (table: string) =>
	(db.get(sql.raw(`select count(*) as n from ${table}`)) as { n: number }).n;
for (const table of ['lot', 'stock_entry', 'batch', 'batch_line', 'audit_event'])
	console.log(`${table.padEnd(12)} ${count(table).toLocaleString('en').padStart(10)} rows`);
db.$client.pragma('wal_checkpoint(TRUNCATE)');
console.log(`Written to ${path}.`);
