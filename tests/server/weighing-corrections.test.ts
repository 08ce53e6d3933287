// Gross weighing errors need a witness; a signed line is corrected by a new signed entry that keeps
// the original and puts the ledger right.
import { eq } from 'drizzle-orm';
import { beforeAll, describe, expect, it } from 'vitest';
import { auditEventsFor } from '$lib/server/audit';
import { completeBatch } from '$lib/server/batches/completion';
import { requireBatch } from '$lib/server/batches/execution';
import { correctLine, correctionsOf } from '$lib/server/batches/line-correction';
import { recordLine, recordLineAtBench } from '$lib/server/batches/line-record';
import { hardBandPercent, setHardBandPercent } from '$lib/server/batches/weighing-band';
import { chooseLot } from '$lib/server/batches/lot-choice';
import { reviewBatch } from '$lib/server/batches/review';
import { buildSheetLines } from '$lib/server/batches/sheet';
import { seedReferenceLibrary } from '$lib/server/components/reference-library';
import { db } from '$lib/server/db';
import { batchLine, eSignature } from '$lib/server/db/schema';
import { addDays } from '$lib/server/inventory/alerts';
import { ledgerOf, onHandOf } from '$lib/server/inventory/ledger';
import { rolesOf } from '$lib/server/people';
import { planBatch } from './batch-fixtures';
import { makeUser, refusalOf } from './helpers';
import { makeApprovedRecipe, makeLead, makeLot, today } from './inventory-fixtures';

type Person = Awaited<ReturnType<typeof makeUser>>;
let lead: Awaited<ReturnType<typeof makeLead>>;
let tech: Person;
let witness: Person;
let reviewer: Person;
let recipe: Awaited<ReturnType<typeof makeApprovedRecipe>>;

beforeAll(async () => {
	seedReferenceLibrary();
	lead = await makeLead();
	tech = await makeUser(['prep_technician']);
	witness = await makeUser(['prep_technician']);
	reviewer = await makeUser(['engineer']);
	// 15.197 g/L: one litre needs 15.197 g (the amount of the gross-error report).
	recipe = await makeApprovedRecipe([
		{ componentId: 'potassium-chloride', amount: 15.197, unit: 'g/L' }
	]);
});

function startedBatch() {
	const b = planBatch(tech, recipe.recipeId, 1, 'Weighing test');
	const lotRow = makeLot(lead.actor, {
		component: 'potassium-chloride',
		expiresOn: addDays(today, 300),
		quantity: '2000',
		unit: 'g'
	});
	const [line] = buildSheetLines(b);
	chooseLot(tech, b.id, line.id, lotRow.code);
	return { b, line, lotRow };
}

const lineRow = (id: string) => db.select().from(batchLine).where(eq(batchLine.id, id)).get()!;

describe('the hard band', () => {
	it('refuses 1519.7 g for a 15.197 g line without a witness, and records it with one', async () => {
		const { b, line } = startedBatch();
		const entry = { actualText: '1519.7', reason: 'typo test' };
		const alone = await refusalOf(() => recordLine(tech, b.id, line.id, entry));
		expect(alone.field).toBe('witnessEmail');
		expect(alone.message).toMatch(/^1519\.7 g is more than 10 % from 15\.197 g: check the balance/);
		expect(lineRow(line.id).doneAt).toBeNull();

		const self = await refusalOf(() =>
			recordLineAtBench(tech, b.id, line.id, {
				...entry,
				witnessEmail: tech.email,
				witnessPassword: tech.password
			})
		);
		expect(self.message).toBe('The witness must be someone other than the person weighing.');
		const wrong = await refusalOf(() =>
			recordLineAtBench(tech, b.id, line.id, {
				...entry,
				witnessEmail: witness.email,
				witnessPassword: 'not-it'
			})
		);
		expect(wrong.field).toBe('witnessPassword');
		const refused = auditEventsFor('batch', b.id).filter((e) => e.action === 'signature.refused');
		expect(refused.map((e) => e.detail?.reason).sort()).toEqual([
			'The witness must be someone other than the person weighing.',
			'wrong password'
		]);

		await recordLineAtBench(tech, b.id, line.id, {
			...entry,
			witnessEmail: witness.email,
			witnessPassword: witness.password
		});
		expect(lineRow(line.id).actualText).toBe('1519.7');
		const signatures = db.select().from(eSignature).where(eq(eSignature.subjectId, line.id)).all();
		expect(signatures.map((s) => [s.meaning, s.signerId])).toEqual([['witnessed', witness.id]]);
		const done = auditEventsFor('batch', b.id).find((e) => e.action === 'batch.line_done')!;
		expect(done.detail?.witnessedBy).toBe(witness.email);
	});

	it('a weighing inside the band needs no witness', () => {
		const { b, line } = startedBatch();
		expect(recordLine(tech, b.id, line.id, { actualText: '15.2' }).verdict).toBe('within');
	});

	it('is a site setting: refused outside 1–100 %, and a wider band lets a 20 % weighing through', async () => {
		const admin = await makeUser(['admin']);
		expect(() => setHardBandPercent(admin, '0')).toThrow(
			/Hard band \(%\) must be a number from 1 to 100/
		);
		expect(() => setHardBandPercent(admin, 'ten')).toThrow('Hard band (%): “ten” is not a number.');
		expect(() => setHardBandPercent(admin, '1,5')).toThrow(/decimal comma/);
		setHardBandPercent(admin, '25');
		try {
			expect(hardBandPercent()).toBe(25);
			const { b, line } = startedBatch();
			const done = recordLine(tech, b.id, line.id, { actualText: '18.2', reason: 'Over-poured' });
			expect(done.verdict).toBe('above');
		} finally {
			setHardBandPercent(admin, '10');
		}
	});
});

describe('corrections of a signed line', () => {
	it('before completion: a signed entry with its reason; the original stays visible', async () => {
		const { b, line } = startedBatch();
		recordLine(tech, b.id, line.id, { actualText: '15.21' });
		const input = {
			actualText: '15.19',
			reason: 'Balance read before it settled',
			password: tech.password
		};
		expect(
			(await refusalOf(() => correctLine(tech, b.id, line.id, { ...input, reason: '' }))).field
		).toBe('reason');
		expect(
			(await refusalOf(() => correctLine(tech, b.id, line.id, { ...input, password: 'nope' })))
				.field
		).toBe('password');
		expect(
			auditEventsFor('batch', b.id)
				.filter((e) => /refused/.test(e.action))
				.map((e) => [e.action, e.detail?.reason])
				.sort()
		).toEqual([
			['batch.correction_refused', 'no reason given'],
			['signature.refused', 'wrong password']
		]);
		await correctLine(tech, b.id, line.id, input);
		expect(lineRow(line.id)).toMatchObject({ actualText: '15.19', actualUg: 15_190_000 });
		expect(correctionsOf(b.id).map((c) => [c.fromText, c.toText, c.reason])).toEqual([
			['15.21', '15.19', 'Balance read before it settled']
		]);
		const corrected = auditEventsFor('batch', b.id).find(
			(e) => e.action === 'batch.line_corrected'
		)!;
		expect(corrected.detail?.changes).toEqual({ actual: { from: '15.21', to: '15.19' } });
	});

	it('after completion: the ledger takes the difference, and a released batch cannot be corrected', async () => {
		const { b, line, lotRow } = startedBatch();
		recordLine(tech, b.id, line.id, { actualText: '15.0', reason: 'Short of the last crystals' });
		await completeBatch(tech, b.id, { password: tech.password });
		expect(onHandOf(lotRow.id)).toBe(2_000_000 - 15_000);
		await correctLine(tech, b.id, line.id, {
			actualText: '15.2',
			reason: 'The printed ticket shows 15.2 g',
			password: tech.password
		});
		expect(onHandOf(lotRow.id)).toBe(2_000_000 - 15_200);
		expect(lineRow(line.id)).toMatchObject({ actualText: '15.2', consumedMg: 15_200 });
		expect(ledgerOf(lotRow.id).map((e) => [e.kind, e.quantity])).toEqual(
			expect.arrayContaining([
				['consumption', -15_000],
				['adjustment', -200]
			])
		);
		await reviewBatch({ ...reviewer, roles: rolesOf(reviewer.id) }, b.id, {
			decision: 'released',
			password: reviewer.password,
			reason: 'Record complete with its correction.'
		});
		expect(requireBatch(b.id).state).toBe('released');
		const late = await refusalOf(() =>
			correctLine(tech, b.id, line.id, {
				actualText: '15.1',
				reason: 'Another look',
				password: tech.password
			})
		);
		expect(late.message).toMatch(/reviewed; its lines can no longer be corrected/);
	});
});
