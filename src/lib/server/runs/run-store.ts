import { and, eq, like, sql } from 'drizzle-orm';
import { z } from 'zod';
import { BATCH_STATE_LABELS } from '$lib/batches';
import { parseLocalDateTime } from '$lib/date-time';
import { RUN_BATCH_ROLES, type RunBatchRole } from '$lib/runs/states';
import { recordAudit, type Actor } from '../audit';
import { db } from '../db';
import { batch, organismProfile, run, runBatch, study, vessel } from '../db/schema';
import { RuleError } from '../rule-error';
import { batchFromScan } from '../batches/execution';
import { siteTimeZone } from '../site-time-zone';
import { optionalText, requiredNumber, requiredText } from '../studies/fields';

export const runSchema = z.object({
	name: requiredText('Name'),
	studyId: z
		.string({ error: 'Choose the study this run follows' })
		.min(1, 'Choose the study this run follows'),
	vesselId: z.string().default(''),
	profileId: z.string().default(''),
	startedAt: z.string({ error: 'Start is required' }).min(1, 'Start is required'),
	gasReferenceTemperatureC: requiredNumber('Gas flow reference temperature', {
		min: -50,
		max: 100,
		unit: '°C'
	}),
	gasReferencePressureKPa: requiredNumber('Gas flow reference pressure', {
		min: 50,
		max: 1000,
		unit: 'kPa'
	}),
	people: optionalText(300),
	notes: optionalText()
});

export type RunForm = z.infer<typeof runSchema>;

/** What the new-run form holds before anyone types: flows stated at standard conditions, 0 °C and 101.325 kPa. */
export const RUN_FORM_DEFAULTS = {
	gasReferenceTemperatureC: '0',
	gasReferencePressureKPa: '101.325'
};

/** Linking a batch: its number (typed or scanned) and what it was used for. */
export const runBatchLinkSchema = z.object({
	batchNumber: z.string().default(''),
	role: z.enum(RUN_BATCH_ROLES, { error: 'Choose medium or feed' })
});

/** RUN-2026-007: the year of the start and the next number in it. */
function nextRunNumber(startedAt: Date, tx: Pick<typeof db, 'select'>): string {
	const year = startedAt.getUTCFullYear();
	const prefix = `RUN-${year}-`;
	const last = tx
		.select({ n: sql<number>`max(cast(substr(${run.number}, ${prefix.length + 1}) as integer))` })
		.from(run)
		.where(like(run.number, `${prefix}%`))
		.get();
	return `${prefix}${String((last?.n ?? 0) + 1).padStart(3, '0')}`;
}

/** Creates the run from its form; the study gives the vessel and organism unless others are chosen. */
export function createRun(
	actor: Actor & { id: string },
	form: RunForm
): { id: string; number: string } {
	const startedAt = parseLocalDateTime(form.startedAt, siteTimeZone());
	if (!startedAt)
		throw new RuleError(`Start “${form.startedAt}” is not a date and time (YYYY-MM-DD HH:MM).`, {
			field: 'startedAt'
		});
	return db.transaction((tx) => {
		const plan = tx.select().from(study).where(eq(study.id, form.studyId)).get();
		if (!plan)
			throw new RuleError('Choose the study this run follows: the one given does not exist.', {
				field: 'studyId'
			});
		const vesselId = form.vesselId || plan.vesselId;
		const profileId = form.profileId || plan.profileId;
		if (!tx.select({ id: vessel.id }).from(vessel).where(eq(vessel.id, vesselId)).get())
			throw new RuleError('That vessel does not exist.', { field: 'vesselId' });
		if (
			!tx
				.select({ id: organismProfile.id })
				.from(organismProfile)
				.where(eq(organismProfile.id, profileId))
				.get()
		)
			throw new RuleError('That organism profile does not exist.', { field: 'profileId' });
		const id = crypto.randomUUID();
		const number = nextRunNumber(startedAt, tx);
		tx.insert(run)
			.values({
				id,
				number,
				name: form.name,
				studyId: plan.id,
				vesselId,
				profileId,
				startedAt,
				gasReferenceTemperatureC: form.gasReferenceTemperatureC,
				gasReferencePressureKPa: form.gasReferencePressureKPa,
				people: form.people,
				notes: form.notes,
				createdById: actor.id
			})
			.run();
		recordAudit(
			actor,
			{
				action: 'run.created',
				subjectType: 'run',
				subjectId: id,
				detail: { number, name: form.name, studyId: plan.id, vesselId, profileId }
			},
			tx
		);
		return { id, number };
	});
}

/** Ends an open run (its page stops refreshing) or opens an ended one again, with a reason. */
export function setRunState(
	actor: Actor,
	runId: string,
	to: 'open' | 'closed',
	reason: string
): void {
	db.transaction((tx) => {
		const current = tx.select().from(run).where(eq(run.id, runId)).get();
		if (!current) throw new RuleError('No such run.', { status: 404 });
		if (current.state === to)
			throw new RuleError(to === 'closed' ? 'The run has already ended.' : 'The run is open.', {
				status: 409
			});
		if (to === 'open' && !reason.trim())
			throw new RuleError('Say why the run is opened again.', { field: 'reason' });
		tx.update(run)
			.set({
				state: to,
				endedAt: to === 'closed' ? new Date() : null,
				revision: current.revision + 1
			})
			.where(eq(run.id, runId))
			.run();
		recordAudit(
			actor,
			{
				action: to === 'closed' ? 'run.closed' : 'run.reopened',
				subjectType: 'run',
				subjectId: runId,
				detail: { reason: reason.trim() || null }
			},
			tx
		);
	});
}

/**
 * Links a batch to the run by its sheet's code (scanned) or its number (typed). Only a
 * released batch may go into a culture; its lots are then traceable to the run.
 */
export function linkBatch(
	actor: Actor & { id: string },
	runId: string,
	batchNumber: string,
	role: RunBatchRole
): { batchId: string; number: string } {
	const number = batchNumber.trim();
	if (!number) throw new RuleError('Scan or type the batch number.', { field: 'batchNumber' });
	if (!RUN_BATCH_ROLES.includes(role))
		throw new RuleError('Choose medium or feed.', { field: 'role' });
	return db.transaction((tx) => {
		if (!tx.select({ id: run.id }).from(run).where(eq(run.id, runId)).get())
			throw new RuleError('No such run.', { status: 404 });
		// the sheet's QR code (its record URL), the batch id, or the number as typed
		const found = batchFromScan(number, tx);
		if (!found)
			throw new RuleError(
				`No batch “${number}”: scan the code on its batch sheet or type its number.`,
				{ field: 'batchNumber' }
			);
		if (found.state !== 'released')
			throw new RuleError(
				`Batch ${found.number} is ${BATCH_STATE_LABELS[found.state].toLowerCase()}, not released: only a released batch may go into a run.`,
				{ field: 'batchNumber' }
			);
		const already = tx
			.select({ role: runBatch.role })
			.from(runBatch)
			.where(and(eq(runBatch.runId, runId), eq(runBatch.batchId, found.id)))
			.get();
		if (already)
			throw new RuleError(`Batch ${found.number} is already linked to this run.`, {
				field: 'batchNumber',
				status: 409
			});
		tx.insert(runBatch).values({ runId, batchId: found.id, role, addedById: actor.id }).run();
		recordAudit(
			actor,
			{
				action: 'run.batch_linked',
				subjectType: 'run',
				subjectId: runId,
				detail: { batchId: found.id, batchNumber: found.number, role }
			},
			tx
		);
		return { batchId: found.id, number: found.number };
	});
}

/** Takes a batch linked by mistake off the run, with the reason; the trail keeps the link. */
export function unlinkBatch(actor: Actor, runId: string, batchId: string, reason: string): void {
	const why = reason.trim();
	if (!why) throw new RuleError('Say why the batch is unlinked.', { field: 'reason' });
	db.transaction((tx) => {
		const link = tx
			.select({ role: runBatch.role, number: batch.number })
			.from(runBatch)
			.innerJoin(batch, eq(runBatch.batchId, batch.id))
			.where(and(eq(runBatch.runId, runId), eq(runBatch.batchId, batchId)))
			.get();
		if (!link) throw new RuleError('That batch is not linked to this run.', { status: 404 });
		tx.delete(runBatch)
			.where(and(eq(runBatch.runId, runId), eq(runBatch.batchId, batchId)))
			.run();
		recordAudit(
			actor,
			{
				action: 'run.batch_unlinked',
				subjectType: 'run',
				subjectId: runId,
				detail: { batchId, batchNumber: link.number, role: link.role, reason: why }
			},
			tx
		);
	});
}
