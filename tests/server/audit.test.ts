import { sql } from 'drizzle-orm';
import { describe, expect, it } from 'vitest';
import { listAuditEvents, recordAudit } from '$lib/server/audit';
import { db } from '$lib/server/db';

/** Drizzle wraps the driver's error; the trigger's own words are in its cause. */
function failureOf(run: () => unknown): string {
	try {
		run();
	} catch (error) {
		const cause = (error as { cause?: Error }).cause;
		return `${(error as Error).message} | ${cause?.message ?? ''}`;
	}
	return 'no error';
}

describe('the audit trail is append-only in the database itself', () => {
	it('accepts new events', () => {
		recordAudit(
			{ id: null, email: 'auditor@lab.test', address: '10.0.0.9' },
			{ action: 'test.appended', detail: { n: 1 } }
		);
		const { rows } = listAuditEvents({ action: 'test.appended', page: 1, pageSize: 10 });
		expect(rows).toHaveLength(1);
		expect(rows[0].actorEmail).toBe('auditor@lab.test');
		expect(rows[0].detail).toEqual({ n: 1 });
	});

	it('refuses UPDATE through the trigger', () => {
		recordAudit({ id: null, email: null }, { action: 'test.update_target' });
		expect(
			failureOf(() =>
				db.run(sql`update audit_event set action = 'tampered' where action = 'test.update_target'`)
			)
		).toMatch(/append-only: UPDATE is refused/);
		expect(listAuditEvents({ action: 'tampered', page: 1, pageSize: 10 }).total).toBe(0);
	});

	it('refuses DELETE through the trigger', () => {
		recordAudit({ id: null, email: null }, { action: 'test.delete_target' });
		expect(
			failureOf(() => db.run(sql`delete from audit_event where action = 'test.delete_target'`))
		).toMatch(/append-only: DELETE is refused/);
		expect(listAuditEvents({ action: 'test.delete_target', page: 1, pageSize: 10 }).total).toBe(1);
	});

	it('filters by person and date range, newest first, with pagination', () => {
		for (let i = 0; i < 7; i++) {
			recordAudit({ id: null, email: 'pager@lab.test' }, { action: 'test.paged', detail: { i } });
		}
		const first = listAuditEvents({ actor: 'PAGER@', page: 1, pageSize: 5 });
		const second = listAuditEvents({ actor: 'pager@', page: 2, pageSize: 5 });
		expect(first.total).toBe(7);
		expect(first.rows).toHaveLength(5);
		expect(second.rows).toHaveLength(2);
		const future = listAuditEvents({
			actor: 'pager@',
			from: new Date(Date.now() + 86_400_000),
			page: 1,
			pageSize: 5
		});
		expect(future.total).toBe(0);
	});
});
