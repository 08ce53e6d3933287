import { beforeAll, describe, expect, it } from 'vitest';
import { and, eq } from 'drizzle-orm';
import { auditEventsFor } from '$lib/server/audit';
import { batchRecordUrl } from '$lib/server/batches/view';
import { db } from '$lib/server/db';
import { batch, runBatch, study } from '$lib/server/db/schema';
import { createRun, linkBatch, unlinkBatch } from '$lib/server/runs/run-store';
import { makeUser, refusalOf } from './helpers';
import { useDemoDatabase } from './demo-database';

useDemoDatabase();

// The batches that went into a run: only released ones, found by the sheet's code or the number,
// and a link made by mistake taken off with its reason.

let actor: { id: string; email: string };
let runId: string;

beforeAll(async () => {
	const person = await makeUser(['engineer']);
	actor = { id: person.id, email: person.email };
	const plan = db.select().from(study).get()!;
	runId = createRun(actor, {
		name: 'Batches test run',
		studyId: plan.id,
		vesselId: '',
		profileId: '',
		startedAt: '2026-12-01T08:00',
		gasReferenceTemperatureC: 0,
		gasReferencePressureKPa: 101.325,
		people: '',
		notes: ''
	}).id;
});

const linkCount = () => db.select().from(runBatch).where(eq(runBatch.runId, runId)).all().length;

describe('linking the batches a run used', () => {
	it('finds a released batch by the URL in its sheet’s QR code, and by its number as typed', () => {
		const [first, second] = db.select().from(batch).where(eq(batch.state, 'released')).all();
		expect(linkBatch(actor, runId, batchRecordUrl(first.id), 'medium').number).toBe(first.number);
		expect(linkBatch(actor, runId, ` ${second.number.toLowerCase()} `, 'feed').number).toBe(
			second.number
		);
		expect(linkCount()).toBe(2);
	});

	it('refuses a batch that is not released, one linked already, and a number that is no batch', async () => {
		const planned = db.select().from(batch).where(eq(batch.state, 'planned')).get()!;
		const notReleased = await refusalOf(() => linkBatch(actor, runId, planned.number, 'medium'));
		expect(notReleased.field).toBe('batchNumber');
		expect(notReleased.message).toMatch(/not released: only a released batch may go into a run/);
		const released = db.select().from(batch).where(eq(batch.state, 'released')).get()!;
		expect((await refusalOf(() => linkBatch(actor, runId, released.number, 'medium'))).status).toBe(
			409
		);
		expect(
			(await refusalOf(() => linkBatch(actor, runId, 'MB-1999-9999', 'medium'))).message
		).toMatch(/No batch “MB-1999-9999”/);
		expect(linkCount()).toBe(2);
	});

	it('unlinks a batch only with a reason, and the trail keeps the link and why', async () => {
		const released = db.select().from(batch).where(eq(batch.state, 'released')).get()!;
		expect((await refusalOf(() => unlinkBatch(actor, runId, released.id, ' '))).field).toBe(
			'reason'
		);
		unlinkBatch(actor, runId, released.id, 'scanned the wrong sheet');
		expect(
			db
				.select()
				.from(runBatch)
				.where(and(eq(runBatch.runId, runId), eq(runBatch.batchId, released.id)))
				.get()
		).toBeUndefined();
		expect(linkCount()).toBe(1);
		const entry = auditEventsFor('run', runId).find((e) => e.action === 'run.batch_unlinked')!;
		expect(entry.detail).toMatchObject({
			batchNumber: released.number,
			reason: 'scanned the wrong sheet'
		});
		expect((await refusalOf(() => unlinkBatch(actor, runId, released.id, 'again'))).status).toBe(
			404
		);
	});
});
