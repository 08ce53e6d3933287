import Database from 'better-sqlite3';
import { drizzle } from 'drizzle-orm/better-sqlite3';
import { migrate } from 'drizzle-orm/better-sqlite3/migrator';
import { cpSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { expect } from 'vitest';

/** A copy of the migrations folder holding only those up to `lastTag`. */
export function migrationsUpTo(lastTag: string): string {
	const dir = mkdtempSync(join(tmpdir(), 'brothwright-migrations-'));
	cpSync('drizzle', dir, { recursive: true });
	const journalPath = join(dir, 'meta', '_journal.json');
	const journal = JSON.parse(readFileSync(journalPath, 'utf8')) as { entries: { tag: string }[] };
	const last = journal.entries.findIndex((e) => e.tag === lastTag);
	expect(last).toBeGreaterThan(0);
	journal.entries = journal.entries.slice(0, last + 1);
	writeFileSync(journalPath, JSON.stringify(journal));
	return dir;
}

/** A fresh database file migrated up to `lastTag`, as an earlier release left it. */
export function databaseAsOf(lastTag: string): Database.Database {
	const path = join(mkdtempSync(join(tmpdir(), 'brothwright-db-')), 'old.db');
	const sqlite = new Database(path);
	migrate(drizzle(sqlite), { migrationsFolder: migrationsUpTo(lastTag) });
	return sqlite;
}
