// The database itself refuses what the procedures forbid, whatever client writes: each rule is tried
// through SQL, the way a tool with file access would.
import { sql } from 'drizzle-orm';
import { beforeAll, describe, expect, it } from 'vitest';
import { seedReferenceLibrary } from '$lib/server/components/reference-library';
import { completeBatch } from '$lib/server/batches/completion';
import { requireBatch } from '$lib/server/batches/execution';
import { recordLine } from '$lib/server/batches/line-record';
import { chooseLot } from '$lib/server/batches/lot-choice';
import { recordMeasurements } from '$lib/server/batches/measurements';
import { reviewBatch } from '$lib/server/batches/review';
import { buildSheetLines } from '$lib/server/batches/sheet';
import { db } from '$lib/server/db';
import { addDays } from '$lib/server/inventory/alerts';
import { findLot } from '$lib/server/inventory/lots';
import { rolesOf } from '$lib/server/people';
import { planBatch } from './batch-fixtures';
import { makeUser } from './helpers';
import { makeApprovedRecipe, makeLead, makeLot, today } from './inventory-fixtures';

/** The trigger's words (Drizzle wraps the driver's error; they are in its cause). */
function refusalOf(statement: ReturnType<typeof sql>): string {
	try {
		db.run(statement);
	} catch (error) {
		return `${(error as Error).message} ${(error as { cause?: Error }).cause?.message ?? ''}`;
	}
	return 'accepted';
}

let lead: Awaited<ReturnType<typeof makeLead>>;
let tech: Awaited<ReturnType<typeof makeUser>>;
let reviewer: Awaited<ReturnType<typeof makeUser>>;
let recipe: Awaited<ReturnType<typeof makeApprovedRecipe>>;

beforeAll(async () => {
	seedReferenceLibrary();
	lead = await makeLead();
	tech = await makeUser(['prep_technician']);
	reviewer = await makeUser(['engineer']);
	recipe = await makeApprovedRecipe([
		{ componentId: 'potassium-chloride', amount: 5, unit: 'g/L' }
	]);
});

const plannedBatch = () => planBatch(tech, recipe.recipeId, 1, 'Lock test');

async function preparedBatch() {
	const b = plannedBatch();
	const lotRow = makeLot(lead.actor, {
		component: 'potassium-chloride',
		expiresOn: addDays(today, 200),
		quantity: '50',
		unit: 'g'
	});
	const [line] = buildSheetLines(b);
	chooseLot(tech, b.id, line.id, lotRow.code);
	recordLine(tech, b.id, line.id, { actualText: '5' });
	recordMeasurements(tech, b.id, { ph: '7.1', osmolality: '' });
	await completeBatch(tech, b.id, { password: tech.password });
	return requireBatch(b.id);
}

describe('batch records', () => {
	it('a batch moves only forward through its states', () => {
		const b = plannedBatch();
		expect(refusalOf(sql`update batch set state = 'released' where id = ${b.id}`)).toMatch(
			/this change of state is not allowed/
		);
		expect(refusalOf(sql`update batch set state = 'prepared' where id = ${b.id}`)).toMatch(
			/not allowed/
		);
		expect(refusalOf(sql`update batch set number = 'MB-1999-0001' where id = ${b.id}`)).toMatch(
			/identity and plan cannot change/
		);
		expect(refusalOf(sql`delete from batch where id = ${b.id}`)).toMatch(/cannot be deleted/);
	});

	it('a prepared batch keeps its measurements; only its review may be added', async () => {
		const b = await preparedBatch();
		expect(refusalOf(sql`update batch set measured_ph = 6.2 where id = ${b.id}`)).toMatch(
			/prepared or reviewed and cannot change/
		);
		expect(refusalOf(sql`update batch set state = 'in_preparation' where id = ${b.id}`)).toMatch(
			/not allowed/
		);
		expect(
			refusalOf(sql`update batch set reviewed_by_id = ${reviewer.id} where id = ${b.id}`)
		).toMatch(/cannot change/);
		await reviewBatch({ ...reviewer, roles: rolesOf(reviewer.id) }, b.id, {
			decision: 'released',
			password: reviewer.password,
			reason: 'Complete.'
		});
		expect(requireBatch(b.id).state).toBe('released');
	});

	it('a released batch cannot go back, nor change its reviewer or its pH', async () => {
		const b = await preparedBatch();
		await reviewBatch({ ...reviewer, roles: rolesOf(reviewer.id) }, b.id, {
			decision: 'released',
			password: reviewer.password,
			reason: 'Complete.'
		});
		for (const change of [
			sql`update batch set state = 'planned' where id = ${b.id}`,
			sql`update batch set state = 'rejected' where id = ${b.id}`,
			sql`update batch set reviewed_by_id = ${tech.id} where id = ${b.id}`,
			sql`update batch set review_note = 'edited' where id = ${b.id}`,
			sql`update batch set measured_ph = 7.4 where id = ${b.id}`
		])
			expect(refusalOf(change)).not.toBe('accepted');
		expect(requireBatch(b.id)).toMatchObject({ state: 'released', measuredPh: 7.1 });
	});
});

describe('recipes', () => {
	it('the name and kind of a recipe with an approved version cannot change', () => {
		expect(
			refusalOf(sql`update recipe set name = 'Renamed' where id = ${recipe.recipeId}`)
		).toMatch(/name and kind of a recipe with a reviewed version cannot change/);
		expect(refusalOf(sql`update recipe set kind = 'feed' where id = ${recipe.recipeId}`)).toMatch(
			/cannot change/
		);
		expect(refusalOf(sql`delete from recipe where id = ${recipe.recipeId}`)).toMatch(
			/cannot be deleted/
		);
	});
});

describe('lots and certificates', () => {
	it('expiry, source and quality figures stay as received', () => {
		const lotRow = makeLot(lead.actor);
		for (const change of [
			sql`update lot set expires_on = '2099-12-31' where id = ${lotRow.id}`,
			sql`update lot set date_kind = 'retest' where id = ${lotRow.id}`,
			sql`update lot set assay_percent = 50 where id = ${lotRow.id}`,
			sql`update lot set supplier_lot = 'X' where id = ${lotRow.id}`
		])
			expect(refusalOf(change)).toMatch(/as received and cannot change/);
		expect(findLot(lotRow.id)?.expiresOn).toBe(lotRow.expiresOn);
	});

	it('status moves only as allowed, and never without who and when', () => {
		const rejected = makeLot(lead.actor, { status: 'quarantine' });
		db.run(
			sql`update lot set status = 'rejected', status_changed_by_id = ${lead.id}, status_changed_at = ${Date.now()} where id = ${rejected.id}`
		);
		expect(
			refusalOf(
				sql`update lot set status = 'released', status_changed_by_id = ${lead.id}, status_changed_at = ${Date.now() + 1} where id = ${rejected.id}`
			)
		).toMatch(/this change of status is not allowed/);
		const held = makeLot(lead.actor, { status: 'quarantine' });
		expect(refusalOf(sql`update lot set status = 'released' where id = ${held.id}`)).toMatch(
			/not allowed/
		);
		expect(findLot(held.id)?.status).toBe('quarantine');
	});

	it('an attached certificate can be neither changed nor removed', () => {
		const lotRow = makeLot(lead.actor);
		expect(
			refusalOf(
				sql`update lot_certificate set sha256 = ${'0'.repeat(64)} where lot_id = ${lotRow.id}`
			)
		).toMatch(/cannot change; attach a new one/);
		expect(refusalOf(sql`delete from lot_certificate where lot_id = ${lotRow.id}`)).toMatch(
			/cannot be removed/
		);
	});
});
