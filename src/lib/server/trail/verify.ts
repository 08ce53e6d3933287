// Checks the tamper-evident chains and the guards that hold them: recomputes every row's hash in
// order, and compares the triggers present with those the committed migrations create.
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import type Database from 'better-sqlite3';
import { CHAINED_TABLES, rowHash, type ChainedTable, type StoredRow } from './chain';

export interface BrokenLink {
	table: ChainedTable;
	/** Place in the chain where the break was found (null for a row outside the chain). */
	seq: number | null;
	id: string;
	problem: string;
}

export interface TrailCheck {
	ok: boolean;
	rowsChecked: Record<ChainedTable, number>;
	/** The first broken link of each chain that has one. */
	breaks: BrokenLink[];
	/** Guard triggers the migrations create that the database no longer has. */
	missingGuards: string[];
}

/** The triggers the migrations leave in place: every CREATE TRIGGER not dropped by a later one. */
export function expectedTriggers(migrationsFolder: string): string[] {
	const present = new Set<string>();
	const files = readdirSync(migrationsFolder)
		.filter((f) => f.endsWith('.sql'))
		.sort();
	for (const file of files) {
		const text = readFileSync(join(migrationsFolder, file), 'utf8');
		for (const [, verb, name] of text.matchAll(
			/\b(CREATE|DROP)\s+TRIGGER\s+(?:IF\s+\w+\s+)?[`"]?(\w+)/gi
		)) {
			if (verb.toUpperCase() === 'CREATE') present.add(name);
			else present.delete(name);
		}
	}
	return [...present].sort();
}

function firstBreakOf(
	sqlite: Database.Database,
	table: ChainedTable
): {
	rows: number;
	broken: BrokenLink | null;
} {
	const outside = sqlite
		.prepare(`SELECT id FROM ${table} WHERE seq IS NULL OR row_hash IS NULL LIMIT 1`)
		.get() as { id: string } | undefined;
	let rows = 0;
	let expectedSeq = 1;
	let prevHash: string | null = null;
	let broken: BrokenLink | null = null;
	for (const row of sqlite
		.prepare(`SELECT * FROM ${table} WHERE seq IS NOT NULL ORDER BY seq`)
		.iterate() as IterableIterator<StoredRow>) {
		rows++;
		if (broken) continue;
		const seq = Number(row.seq);
		const id = String(row.id);
		if (seq !== expectedSeq) {
			broken = {
				table,
				seq: expectedSeq,
				id,
				problem: `row ${expectedSeq} is missing: the next row found is ${seq}`
			};
		} else if (row.prev_hash !== prevHash) {
			broken = { table, seq, id, problem: 'it does not carry the hash of the row before it' };
		} else if (row.row_hash !== rowHash(table, row, seq, prevHash)) {
			broken = { table, seq, id, problem: 'its content no longer matches its hash' };
		}
		expectedSeq = seq + 1;
		prevHash = typeof row.row_hash === 'string' ? row.row_hash : null;
	}
	if (!broken && outside)
		broken = { table, seq: null, id: outside.id, problem: 'it was written outside the chain' };
	return { rows, broken };
}

/**
 * A chain alone cannot show rows cut from its end; the audit trail records every signature it
 * saw made, so a signature it names that is gone is a break too.
 */
function missingSignature(sqlite: Database.Database): BrokenLink | null {
	const gone = sqlite
		.prepare(
			`SELECT a.seq AS seq, json_extract(a.detail, '$.signatureId') AS signatureId
			 FROM audit_event a
			 WHERE a.action = 'signature.recorded'
				AND json_extract(a.detail, '$.signatureId') IS NOT NULL
				AND NOT EXISTS (SELECT 1 FROM e_signature s WHERE s.id = json_extract(a.detail, '$.signatureId'))
			 ORDER BY a.seq LIMIT 1`
		)
		.get() as { seq: number; signatureId: string } | undefined;
	return gone
		? {
				table: 'e_signature',
				seq: null,
				id: gone.signatureId,
				problem: `the signature recorded by audit entry ${gone.seq} is gone`
			}
		: null;
}

export function verifyTrail(sqlite: Database.Database, migrationsFolder: string): TrailCheck {
	const rowsChecked = {} as Record<ChainedTable, number>;
	const breaks: BrokenLink[] = [];
	for (const table of Object.keys(CHAINED_TABLES) as ChainedTable[]) {
		const { rows, broken } = firstBreakOf(sqlite, table);
		rowsChecked[table] = rows;
		if (broken) breaks.push(broken);
	}
	const gone = breaks.some((b) => b.table === 'e_signature') ? null : missingSignature(sqlite);
	if (gone) breaks.push(gone);
	const present = new Set(
		(
			sqlite.prepare(`SELECT name FROM sqlite_master WHERE type = 'trigger'`).all() as {
				name: string;
			}[]
		).map((t) => t.name)
	);
	const missingGuards = expectedTriggers(migrationsFolder).filter((name) => !present.has(name));
	return {
		ok: breaks.length === 0 && missingGuards.length === 0,
		rowsChecked,
		breaks,
		missingGuards
	};
}

/** One sentence per finding, for the command line and the admin page. */
export function describeTrailCheck(check: TrailCheck): string[] {
	const counts = Object.entries(check.rowsChecked)
		.map(([table, n]) => `${n} ${table === 'audit_event' ? 'audit entries' : 'signatures'}`)
		.join(' and ');
	if (check.ok) return [`The trail is intact: ${counts} checked, every guard in place.`];
	return [
		...check.breaks.map(
			(b) =>
				`First broken link in ${b.table}${b.seq === null ? '' : ` at row ${b.seq}`} (id ${b.id}): ${b.problem}.`
		),
		...check.missingGuards.map((name) => `The database guard “${name}” has been removed.`)
	];
}
