import { eq } from 'drizzle-orm';
import { beforeAll, describe, expect, it } from 'vitest';
import { seedReferenceLibrary } from '$lib/server/components/reference-library';
import { checkBatchInput, createBatch } from '$lib/server/batches/create';
import { completeBatch } from '$lib/server/batches/completion';
import { auditEventsFor } from '$lib/server/audit';
import { requireBatch } from '$lib/server/batches/execution';
import { recordLine } from '$lib/server/batches/line-record';
import { chooseLot, lotFromScan } from '$lib/server/batches/lot-choice';
import { recordMeasurements } from '$lib/server/batches/measurements';
import {
	formatBatchNumber,
	patternProblem,
	setBatchNumberPattern
} from '$lib/server/batches/numbering';
import { reviewBatch } from '$lib/server/batches/review';
import { buildSheetLines } from '$lib/server/batches/sheet';
import { batchView } from '$lib/server/batches/view';
import { db } from '$lib/server/db';
import { batchDeviation, stockEntry } from '$lib/server/db/schema';
import { addDays } from '$lib/server/inventory/alerts';
import { ledgerOf, ledgerSums, onHandOf } from '$lib/server/inventory/ledger';
import { batchesUsingLot, lotsUsedByBatch } from '$lib/server/inventory/where-used';
import { rolesOf } from '$lib/server/people';
import { makeUser } from './helpers';
import { makeApprovedRecipe, makeLead, makeLot, today } from './inventory-fixtures';

let lead: Awaited<ReturnType<typeof makeLead>>;
let tech: Awaited<ReturnType<typeof makeUser>>;
let recipe: Awaited<ReturnType<typeof makeApprovedRecipe>>;

beforeAll(async () => {
	seedReferenceLibrary();
	lead = await makeLead();
	tech = await makeUser(['prep_technician']);
	recipe = await makeApprovedRecipe([
		{ componentId: 'potassium-chloride', amount: 5, unit: 'g/L' }
	]);
});

function plan(volumeL = 1, r = recipe) {
	const checked = checkBatchInput({
		recipeId: r.recipeId,
		targetVolumeL: volumeL,
		plannedOn: today,
		intendedUse: 'Flask test'
	});
	if (!checked.ok) throw new Error(JSON.stringify(checked.fieldErrors));
	return createBatch(tech, checked.value);
}

describe('planning a batch', () => {
	it('numbers batches by the site pattern, per year', () => {
		expect(formatBatchNumber('MB-{YYYY}-{seq}', new Date('2026-03-04T00:00:00Z'), 7)).toBe(
			'MB-2026-0007'
		);
		expect(formatBatchNumber('{YY}{MM}/{seq}', new Date('2026-03-04T00:00:00Z'), 12)).toBe(
			'2603/0012'
		);
		expect(patternProblem('MB-{seq}')).toMatch(/needs \{YYYY\} or \{YY\}/);
		expect(patternProblem('MB-{YYYY}-{n}')).toMatch(/needs \{seq\}/);
		expect(patternProblem('MB-{YYYY}-{seq}-{DD}')).toBe(
			'{DD} is not a field; use {YYYY}, {YY}, {MM}, {seq}.'
		);
		const first = plan();
		const second = plan();
		expect(second.numberSeq).toBe(first.numberSeq + 1);
		setBatchNumberPattern(tech, 'PPN-{YY}-{seq}');
		expect(plan().number).toMatch(/^PPN-\d{2}-\d{4}$/);
		setBatchNumberPattern(tech, 'MB-{YYYY}-{seq}');
	});

	it('refuses a recipe with no approved version, a bad volume and a missing use, each at its field', () => {
		const checked = checkBatchInput({
			recipeId: 'nope',
			targetVolumeL: '2,5 L',
			plannedOn: '2026-02-30',
			intendedUse: ''
		});
		expect(checked.ok).toBe(false);
		expect(!checked.ok && Object.keys(checked.fieldErrors).sort()).toEqual([
			'intendedUse',
			'plannedOn',
			'recipeId',
			'targetVolumeL'
		]);
		expect(
			checkBatchInput({
				recipeId: recipe.recipeId,
				targetVolumeL: '2.5',
				plannedOn: today,
				intendedUse: 'x'
			}).ok
		).toBe(true);
	});
});

describe('the lot check at the bench', () => {
	it('suggests the first-expiring usable lot and refuses a wrong, quarantined, expired, short or unknown one', () => {
		const later = makeLot(lead.actor, {
			component: 'potassium-chloride',
			expiresOn: addDays(today, 300),
			quantity: '50',
			unit: 'g'
		});
		const sooner = makeLot(lead.actor, {
			component: 'potassium-chloride',
			expiresOn: addDays(today, 100),
			quantity: '50',
			unit: 'g'
		});
		const tiny = makeLot(lead.actor, {
			component: 'potassium-chloride',
			expiresOn: addDays(today, 50),
			quantity: '1',
			unit: 'g'
		});
		const held = makeLot(lead.actor, {
			component: 'potassium-chloride',
			status: 'quarantine',
			expiresOn: addDays(today, 20)
		});
		const expired = makeLot(lead.actor, {
			component: 'potassium-chloride',
			receivedOn: addDays(today, -60),
			expiresOn: addDays(today, -1)
		});
		const wrong = makeLot(lead.actor, { component: 'sodium-chloride' });
		const b = plan(1);
		const [line] = buildSheetLines(b);
		expect(line.suggestion?.code).toBe(sooner.code);
		expect(line.requiredText).toBe('5 g');
		const refusal = (code: string) => {
			try {
				chooseLot(tech, b.id, line.id, code);
				return 'accepted';
			} catch (cause) {
				return (cause as Error).message;
			}
		};
		expect(refusal(wrong.code)).toBe(
			`Wrong lot: ${wrong.code} is Sodium chloride; this line needs Potassium chloride.`
		);
		expect(refusal(held.code)).toBe(`Lot ${held.code} is in quarantine, not released for use.`);
		expect(refusal(expired.code)).toBe(
			`Lot ${expired.code} is expired: its expiry date was ${addDays(today, -1)}.`
		);
		expect(refusal(tiny.code)).toBe(`Lot ${tiny.code} has 1 g on hand; this line needs 5 g.`);
		expect(refusal('NOT-A-LOT')).toBe(
			'“NOT-A-LOT” is not a lot known here. Scan the label of a lot, or type its lot id (like L-2026-0001).'
		);
		// Each refusal is in the trail, though the refused choice itself was rolled back.
		const refused = auditEventsFor('batch', b.id).filter((e) => e.action === 'batch.lot_refused');
		expect(refused.map((e) => [e.detail?.lot, e.actorId]).sort()).toEqual(
			[
				[wrong.code, tech.id],
				[held.code, tech.id],
				[expired.code, tech.id],
				[tiny.code, tech.id],
				[null, tech.id]
			].sort()
		);
		expect(refused.find((e) => e.detail?.lot === null)?.detail).toMatchObject({
			line: line.position,
			scanned: 'NOT-A-LOT'
		});
		expect(refused.find((e) => e.detail?.lot === held.code)?.detail?.reason).toBe(
			`Lot ${held.code} is in quarantine, not released for use.`
		);
		expect(
			chooseLot(tech, b.id, line.id, `https://elsewhere.test/lots/${later.code}`)
		).toMatchObject({ lotCode: later.code, repeated: false });
		expect(chooseLot(tech, b.id, line.id, later.code.toLowerCase())).toMatchObject({
			repeated: true
		});
		expect(requireBatch(b.id).state).toBe('in_preparation');
		expect(lotFromScan(`  ${later.id} `)?.code).toBe(later.code);
	});
});

describe('weighing, completion and review', () => {
	it('demands a reason out of tolerance, keeps it as a deviation, and accepts a double submit once', async () => {
		makeLot(lead.actor, {
			component: 'potassium-chloride',
			quantity: '500',
			unit: 'g',
			expiresOn: addDays(today, 30)
		});
		const b = plan(2);
		const [line] = buildSheetLines(b);
		chooseLot(tech, b.id, line.id, line.suggestion!.code);
		expect(() => recordLine(tech, b.id, line.id, { actualText: '10.5 g' })).toThrow(
			'10.5 g is above the tolerance (10 g ± 2 %). Give the reason; it is recorded as a deviation.'
		);
		expect(() => recordLine(tech, b.id, line.id, { actualText: '10.5 grams' })).toThrow(
			'Mass: “grams” is not a mass unit here: use g, mg, kg, µg.'
		);
		expect(
			recordLine(tech, b.id, line.id, {
				actualText: '10.5 g',
				reason: 'Spatula overshoot; QA informed'
			})
		).toMatchObject({ repeated: false, verdict: 'above' });
		expect(
			recordLine(tech, b.id, line.id, {
				actualText: '10.5 g',
				reason: 'Spatula overshoot; QA informed'
			})
		).toMatchObject({ repeated: true });
		expect(() => recordLine(tech, b.id, line.id, { actualText: '10 g' })).toThrow(
			/already signed as done with 10.5 g/
		);
		expect(
			db.select().from(batchDeviation).where(eq(batchDeviation.batchId, b.id)).all()
		).toHaveLength(1);
	});

	it('takes stock from every lot at completion, only with the right password, and keeps where-used both ways', async () => {
		const lotRow = makeLot(lead.actor, {
			component: 'potassium-chloride',
			quantity: '20',
			unit: 'g',
			expiresOn: addDays(today, 10)
		});
		const b = plan(1);
		const [line] = buildSheetLines(b);
		chooseLot(tech, b.id, line.id, lotRow.code);
		recordLine(tech, b.id, line.id, { actualText: '5.02' });
		await expect(completeBatch(tech, b.id, { password: 'wrong-password' })).rejects.toThrow(
			/nothing was signed/
		);
		expect(onHandOf(lotRow.id)).toBe(20_000);
		await completeBatch(tech, b.id, { password: tech.password });
		expect(onHandOf(lotRow.id)).toBe(20_000 - 5_020);
		expect(ledgerOf(lotRow.id).at(-1)).toMatchObject({
			kind: 'consumption',
			quantity: -5_020,
			batchId: b.id
		});
		expect(batchesUsingLot(lotRow.id)).toMatchObject([
			{ batchNumber: b.number, state: 'prepared', consumedQuantity: 5_020 }
		]);
		expect(lotsUsedByBatch(b.id)).toMatchObject([
			{ lotCode: lotRow.code, consumedQuantity: 5_020 }
		]);
		expect(batchView(b.id).signatures.map((s) => s.meaning)).toEqual(['prepared']);

		// A person with both roles who prepared it may not review it.
		const both = await makeUser(['prep_technician', 'engineer']);
		const b2 = plan(1);
		const [l2] = buildSheetLines(b2);
		chooseLot(both, b2.id, l2.id, lotRow.code);
		recordLine(both, b2.id, l2.id, { actualText: '5' });
		await completeBatch(both, b2.id, { password: both.password });
		await expect(
			reviewBatch({ ...both, roles: rolesOf(both.id) }, b2.id, {
				decision: 'released',
				password: both.password,
				reason: ''
			})
		).rejects.toThrow('You prepared this batch, so someone else must review it.');
		expect(
			auditEventsFor('batch', b2.id)
				.filter((e) => e.action === 'signature.refused')
				.map((e) => [e.actorId, e.detail?.meaning, e.detail?.reason])
		).toEqual([[both.id, 'released', 'You prepared this batch, so someone else must review it.']]);
		const scientist = await makeUser(['media_scientist']);
		await expect(
			reviewBatch({ ...scientist, roles: rolesOf(scientist.id) }, b2.id, {
				decision: 'rejected',
				password: scientist.password,
				reason: ''
			})
		).rejects.toThrow('Give the reason for rejecting the batch.');
		await reviewBatch({ ...scientist, roles: rolesOf(scientist.id) }, b2.id, {
			decision: 'released',
			password: scientist.password,
			reason: 'Record complete.'
		});
		expect(requireBatch(b2.id).state).toBe('released');
		await expect(
			reviewBatch({ ...tech, roles: rolesOf(tech.id) }, b.id, {
				decision: 'released',
				password: tech.password,
				reason: ''
			})
		).rejects.toThrow(/needs the role Media scientist or Process engineer/);
	});

	it('lets only one of two batches completing at once against one lot take its stock; the ledger stays equal to on-hand', async () => {
		const lotRow = makeLot(lead.actor, {
			component: 'potassium-chloride',
			quantity: '8',
			unit: 'g',
			expiresOn: addDays(today, 5)
		});
		const batches = [plan(1), plan(1)];
		for (const b of batches) {
			const [line] = buildSheetLines(b);
			chooseLot(tech, b.id, line.id, lotRow.code);
			recordLine(tech, b.id, line.id, { actualText: '5 g' });
		}
		const outcomes = await Promise.allSettled(
			batches.map((b) => completeBatch(tech, b.id, { password: tech.password }))
		);
		expect(outcomes.map((o) => o.status).sort()).toEqual(['fulfilled', 'rejected']);
		const refused = outcomes.find((o) => o.status === 'rejected') as PromiseRejectedResult;
		expect(refused.reason.message).toMatch(
			new RegExp(`Lot ${lotRow.code} has 3 g on hand; taking 5 g would make it negative`)
		);
		expect(onHandOf(lotRow.id)).toBe(3_000);
		expect(batches.map((b) => requireBatch(b.id).state).sort()).toEqual([
			'in_preparation',
			'prepared'
		]);
		const loser = batches.find((b) => requireBatch(b.id).state === 'in_preparation')!;
		expect(db.select().from(stockEntry).where(eq(stockEntry.batchId, loser.id)).all()).toHaveLength(
			0
		);
		expect(batchView(loser.id).signatures).toHaveLength(0);
		for (const { lotId, total } of ledgerSums()) {
			expect(onHandOf(lotId)).toBe(total);
			expect(total).toBeGreaterThanOrEqual(0);
		}
	});

	it('checks pH and osmolality against the range and needs a reason outside it', async () => {
		const r = await makeApprovedRecipe(
			[{ componentId: 'potassium-chloride', amount: 1, unit: 'g/L' }],
			{ targetPh: '7.0', osmolalityMinMOsmPerKg: '20', osmolalityMaxMOsmPerKg: '40' }
		);
		const b = plan(1, r);
		expect(() => recordMeasurements(tech, b.id, { ph: '7.5', osmolality: '30' })).toThrow(
			'pH 7.5 outside 6.8–7.2 (target 7 ± 0.2, common practice). Give the reason; it is recorded as a deviation.'
		);
		expect(() => recordMeasurements(tech, b.id, { ph: 'seven', osmolality: '30' })).toThrow(
			'Measured pH: “seven” is not a number.'
		);
		recordMeasurements(tech, b.id, {
			ph: '7.1',
			osmolality: '45',
			osmolalityReason: 'Salt lot on the high side; engineer consulted'
		});
		expect(requireBatch(b.id)).toMatchObject({ measuredPh: 7.1, measuredOsmolality: 45 });
		expect(batchView(b.id).deviations.map((d) => d.kind)).toEqual(['osmolality']);
	});
});
