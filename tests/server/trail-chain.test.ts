// The audit trail and the signatures are hash chains; verify-trail finds any edit made behind the
// application's back, even with the database's guards removed.
import Database from 'better-sqlite3';
import { drizzle } from 'drizzle-orm/better-sqlite3';
import { migrate } from 'drizzle-orm/better-sqlite3/migrator';
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { recordAudit } from '$lib/server/audit';
import { db } from '$lib/server/db';
import { insertSignature, signRecord } from '$lib/server/signatures';
import { rowHash, sealUnchainedRows } from '$lib/server/trail/chain';
import { describeTrailCheck, expectedTriggers, verifyTrail } from '$lib/server/trail/verify';
import { makeUser } from './helpers';
import { databaseAsOf } from './migration-steps';

const MIGRATIONS = 'drizzle';

/** A copy of the test database, opened directly, as someone with file access would. */
function copyOfDatabase(): Database.Database {
	const path = join(mkdtempSync(join(tmpdir(), 'brothwright-trail-')), 'copy.db');
	db.$client.prepare('VACUUM INTO ?').run(path);
	return new Database(path);
}

let person: Awaited<ReturnType<typeof makeUser>>;

beforeAll(async () => {
	person = await makeUser(['engineer']);
	for (let i = 0; i < 5; i++)
		recordAudit(person, { action: 'test.chained', subjectType: 'test', subjectId: `t${i}` });
	insertSignature({
		signerId: person.id,
		signerEmail: person.email,
		signerName: 'Person',
		meaning: 'verified',
		subjectType: 'test',
		subjectId: 't1'
	});
	await signRecord(
		{
			user: person,
			password: person.password,
			meaning: 'verified',
			subjectType: 'test',
			subjectId: 't2'
		},
		() => undefined
	);
});

describe('the trail is a hash chain', () => {
	it('is intact after normal use, with every guard the migrations create', () => {
		const check = verifyTrail(db.$client, MIGRATIONS);
		expect(check.breaks).toEqual([]);
		expect(check.missingGuards).toEqual([]);
		expect(check.ok).toBe(true);
		expect(check.rowsChecked.audit_event).toBeGreaterThanOrEqual(5);
		expect(check.rowsChecked.e_signature).toBeGreaterThanOrEqual(1);
		expect(expectedTriggers(MIGRATIONS)).toEqual(
			expect.arrayContaining([
				'audit_event_no_update',
				'audit_event_chained',
				'e_signature_chained'
			])
		);
		expect(describeTrailCheck(check)[0]).toMatch(/^The trail is intact/);
	});

	it('each row carries the SHA-256 of its content, its place and the hash before it', () => {
		const rows = db.$client
			.prepare('SELECT * FROM audit_event ORDER BY seq DESC LIMIT 2')
			.all() as Record<string, string | number | null>[];
		const [last, before] = rows;
		expect(last.prev_hash).toBe(before.row_hash);
		expect(last.row_hash).toBe(
			rowHash('audit_event', last, Number(last.seq), String(before.row_hash))
		);
		expect(last.row_hash).toMatch(/^[0-9a-f]{64}$/);
	});

	it('refuses a row that does not continue the chain, and any UPDATE', () => {
		const sqlite = db.$client;
		expect(() =>
			sqlite
				.prepare(
					`INSERT INTO audit_event (id, at, action, seq, prev_hash, row_hash) VALUES ('forged', 0, 'x', 1, NULL, ?)`
				)
				.run('0'.repeat(64))
		).toThrow(/must continue the chain/);
		expect(() => sqlite.prepare(`UPDATE audit_event SET action = 'x' WHERE seq = 1`).run()).toThrow(
			/append-only/
		);
		expect(() =>
			sqlite.prepare(`UPDATE audit_event SET row_hash = ? WHERE seq = 1`).run('f'.repeat(64))
		).toThrow(/append-only/);
	});

	it('with the triggers dropped, an edited row is named as the first broken link', () => {
		const copy = copyOfDatabase();
		copy.exec('DROP TRIGGER audit_event_no_update');
		const target = copy
			.prepare(`SELECT id, seq FROM audit_event WHERE subject_id = 't2'`)
			.get() as {
			id: string;
			seq: number;
		};
		copy.prepare(`UPDATE audit_event SET action = 'test.rewritten' WHERE id = ?`).run(target.id);
		const check = verifyTrail(copy, MIGRATIONS);
		expect(check.ok).toBe(false);
		expect(check.breaks).toEqual([
			{
				table: 'audit_event',
				seq: target.seq,
				id: target.id,
				problem: 'its content no longer matches its hash'
			}
		]);
		expect(check.missingGuards).toEqual(['audit_event_no_update']);
		expect(describeTrailCheck(check)).toEqual([
			`First broken link in audit_event at row ${target.seq} (id ${target.id}): its content no longer matches its hash.`,
			'The database guard “audit_event_no_update” has been removed.'
		]);
	});

	it('finds a deleted signature and a re-hashed row that no longer links', () => {
		const copy = copyOfDatabase();
		copy.exec('DROP TRIGGER e_signature_no_delete; DROP TRIGGER audit_event_no_update;');
		const first = copy.prepare('SELECT id FROM e_signature WHERE seq = 1').get() as { id: string };
		copy.prepare('DELETE FROM e_signature WHERE id = ?').run(first.id);
		// A forger who recomputes the edited row's own hash still breaks the next row's link.
		const row = copy.prepare(`SELECT * FROM audit_event WHERE subject_id = 't3'`).get() as Record<
			string,
			string | number | null
		>;
		const forged = { ...row, action: 'test.rewritten' };
		copy
			.prepare('UPDATE audit_event SET action = ?, row_hash = ? WHERE id = ?')
			.run(
				'test.rewritten',
				rowHash('audit_event', forged, Number(row.seq), row.prev_hash as string | null),
				row.id
			);
		const breaks = verifyTrail(copy, MIGRATIONS).breaks;
		expect(breaks.find((b) => b.table === 'audit_event')).toMatchObject({
			seq: Number(row.seq) + 1,
			problem: 'it does not carry the hash of the row before it'
		});
		expect(breaks.find((b) => b.table === 'e_signature')).toMatchObject({
			seq: 1,
			problem: 'row 1 is missing: the next row found is 2'
		});
	});

	it('finds the last signature cut from the end of its chain through the audit entry that recorded it', () => {
		const copy = copyOfDatabase();
		copy.exec('DROP TRIGGER e_signature_no_delete');
		const last = copy.prepare('SELECT id FROM e_signature ORDER BY seq DESC LIMIT 1').get() as {
			id: string;
		};
		copy.prepare('DELETE FROM e_signature WHERE id = ?').run(last.id);
		expect(verifyTrail(copy, MIGRATIONS).breaks).toEqual([
			{
				table: 'e_signature',
				seq: null,
				id: last.id,
				problem: expect.stringMatching(/^the signature recorded by audit entry \d+ is gone$/)
			}
		]);
	});

	it('seals the rows an earlier release wrote, in their order, once', () => {
		const sqlite = databaseAsOf('0018_recipe_version_editor_rules');
		const insert = sqlite.prepare(
			`INSERT INTO audit_event (id, at, action, subject_type, subject_id, detail) VALUES (?, ?, 'old.entry', 'test', ?, ?)`
		);
		insert.run('old-b', 2000, 'b', '{"n":2}');
		insert.run('old-a', 1000, 'a', null);
		migrate(drizzle(sqlite), { migrationsFolder: MIGRATIONS });
		expect(sealUnchainedRows(sqlite)).toBe(2);
		expect(sealUnchainedRows(sqlite)).toBe(0);
		const order = sqlite.prepare('SELECT id, seq FROM audit_event ORDER BY seq').all();
		expect(order).toEqual([
			{ id: 'old-a', seq: 1 },
			{ id: 'old-b', seq: 2 }
		]);
		expect(verifyTrail(sqlite, MIGRATIONS).ok).toBe(true);
	});
});
