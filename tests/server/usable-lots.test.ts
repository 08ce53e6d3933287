import { eq } from 'drizzle-orm';
import { beforeAll, describe, expect, it } from 'vitest';
import { isUsableLot, lotUnusability } from '$lib/inventory';
import { seedReferenceLibrary } from '$lib/server/components/reference-library';
import { db } from '$lib/server/db';
import { lot } from '$lib/server/db/schema';
import { addDays } from '$lib/server/inventory/alerts';
import { usableLotCondition } from '$lib/server/inventory/usable';
import { decideLot, makeLead, makeLot, today } from './inventory-fixtures';

beforeAll(() => {
	seedReferenceLibrary();
});

describe('a usable lot: released and not expired', () => {
	it('is usable through its date and not the day after', () => {
		const released = { status: 'released' as const, expiresOn: '2026-03-31', retestOn: null };
		expect(isUsableLot(released, '2026-03-30')).toBe(true);
		expect(isUsableLot(released, '2026-03-31')).toBe(true);
		expect(isUsableLot(released, '2026-04-01')).toBe(false);
		expect(lotUnusability(released, '2026-04-01')).toBe('expired');
	});

	it('is not usable from its retest date until it is retested', () => {
		const due = { status: 'released' as const, expiresOn: '2027-12-31', retestOn: '2026-05-10' };
		expect(isUsableLot(due, '2026-05-09')).toBe(true);
		expect(lotUnusability(due, '2026-05-10')).toBe('retest');
		expect(isUsableLot(due, '2026-06-01')).toBe(false);
	});

	it('is never usable in quarantine or rejected, whatever its date; the status is told first', () => {
		expect(
			lotUnusability(
				{ status: 'quarantine', expiresOn: '2030-01-01', retestOn: null },
				'2026-01-01'
			)
		).toBe('quarantine');
		expect(
			lotUnusability({ status: 'rejected', expiresOn: '2020-01-01', retestOn: null }, '2026-01-01')
		).toBe('rejected');
		expect(
			isUsableLot({ status: 'rejected', expiresOn: '2030-01-01', retestOn: null }, '2026-01-01')
		).toBe(false);
	});

	it('selects in SQL exactly the lots the predicate calls usable', async () => {
		const lead = await makeLead();
		const lots = [
			makeLot(lead.actor),
			makeLot(lead.actor, { expiresOn: today }),
			makeLot(lead.actor, { status: 'quarantine' }),
			makeLot(lead.actor, { receivedOn: addDays(today, -40), expiresOn: addDays(today, -1) })
		];
		const rejected = makeLot(lead.actor, { status: 'quarantine' });
		decideLot(lead.actor, rejected.id, 'rejected', 'Certificate does not match the label.');
		lots.push(rejected);
		const ids = lots.map((l) => l.id);
		const rows = db
			.select()
			.from(lot)
			.all()
			.filter((row) => ids.includes(row.id));
		const bySql = db
			.select({ id: lot.id })
			.from(lot)
			.where(usableLotCondition(today))
			.all()
			.map((r) => r.id)
			.filter((id) => ids.includes(id));
		const byPredicate = rows.filter((row) => isUsableLot(row, today)).map((r) => r.id);
		expect(bySql.sort()).toEqual(byPredicate.sort());
		expect(byPredicate.sort()).toEqual([lots[0].id, lots[1].id].sort());
		expect(db.select().from(lot).where(eq(lot.id, lots[3].id)).get()!.status).toBe('released');
	});
});
