// Recall as a signed act: the lot on hold (or sent to retest), every batch made from it flagged at
// any depth through stocks, stocks made from it held, and the people concerned told by mail.
import { eq } from 'drizzle-orm';
import { beforeAll, describe, expect, it } from 'vitest';
import { isUsableLot } from '$lib/inventory';
import { auditEventsFor } from '$lib/server/audit';
import { seedReferenceLibrary } from '$lib/server/components/reference-library';
import { db } from '$lib/server/db';
import { eSignature } from '$lib/server/db/schema';
import { addDays } from '$lib/server/inventory/alerts';
import { findLot, findLotByCode } from '$lib/server/inventory/lots';
import { recallFlagsOf, recallLot, recallsOf } from '$lib/server/inventory/recall';
import { recordRetest } from '$lib/server/inventory/retest';
import { rolesOf } from '$lib/server/people';
import { makeBatch, stockAndMedium } from './batch-fixtures';
import { makeUser, refusalOf } from './helpers';
import { makeApprovedRecipe, makeLead, makeLot, today } from './inventory-fixtures';
import { latestMailTo, useMailStandIn } from './mail';

useMailStandIn();

type Person = Awaited<ReturnType<typeof makeUser>>;
let lead: Awaited<ReturnType<typeof makeLead>>;
let tech: Person;
let reviewer: Person;
let stockRecipe: Awaited<ReturnType<typeof makeApprovedRecipe>>;
let medium: Awaited<ReturnType<typeof makeApprovedRecipe>>;

beforeAll(async () => {
	seedReferenceLibrary();
	lead = await makeLead();
	tech = await makeUser(['prep_technician']);
	reviewer = await makeUser(['engineer']);
	({ stockRecipe, medium } = await stockAndMedium('90'));
});

const asLead = () => ({ ...lead, roles: rolesOf(lead.id) });

describe('a recall', () => {
	it('holds the lot, flags batches through a stock, holds the stock, and tells leads and reviewers', async () => {
		const raw = makeLot(lead.actor, {
			component: 'magnesium-sulfate',
			expiresOn: addDays(today, 400),
			quantity: '500',
			unit: 'g'
		});
		const stockBatch = await makeBatch(tech, stockRecipe.recipeId, 0.5, [raw.code], reviewer);
		const salt = makeLot(lead.actor, { component: 'sodium-chloride', quantity: '100', unit: 'g' });
		const mediumBatch = await makeBatch(tech, medium.recipeId, 1, [salt.code, stockBatch.number]);

		const noReason = await refusalOf(() =>
			recallLot(asLead(), raw.id, { lotAction: 'hold', reason: '', password: lead.password })
		);
		expect(noReason.field).toBe('reason');
		const wrong = await refusalOf(() =>
			recallLot(asLead(), raw.id, {
				lotAction: 'hold',
				reason: 'Supplier notice 44',
				password: 'nope'
			})
		);
		expect(wrong.field).toBe('password');
		const notLead = await refusalOf(() =>
			recallLot({ ...tech, roles: rolesOf(tech.id) }, raw.id, {
				lotAction: 'hold',
				reason: 'Supplier notice 44',
				password: tech.password
			})
		);
		expect(notLead.status).toBe(403);
		const refusals = auditEventsFor('lot', raw.id).filter((e) => /refused/.test(e.action));
		expect(refusals).toHaveLength(3);

		const outcome = await recallLot(asLead(), raw.id, {
			lotAction: 'hold',
			reason: 'Supplier notice 44: contamination',
			password: lead.password
		});
		expect(findLot(raw.id)?.status).toBe('quarantine');
		expect(outcome.flagged.map((f) => [f.batchNumber, f.depth, f.viaLotCode])).toEqual([
			[stockBatch.number, 1, null],
			[mediumBatch.number, 2, stockBatch.number]
		]);
		expect(outcome.heldStocks).toEqual([stockBatch.number]);
		expect(findLotByCode(stockBatch.number)?.status).toBe('quarantine');
		expect(recallFlagsOf(mediumBatch.id).map((f) => [f.lotCode, f.depth, f.viaLotCode])).toEqual([
			[raw.code, 2, stockBatch.number]
		]);
		expect(recallsOf(raw.id).map((r) => [r.lotAction, r.reason])).toEqual([
			['hold', 'Supplier notice 44: contamination']
		]);
		const signatures = db.select().from(eSignature).where(eq(eSignature.subjectId, raw.id)).all();
		expect(signatures.map((s) => s.meaning)).toContain('recalled');
		expect(outcome.mailProblem).toBeNull();
		expect(outcome.mailed).toEqual(expect.arrayContaining([lead.email, reviewer.email]));
		expect(outcome.mailed).not.toContain(tech.email);
		const mail = latestMailTo(reviewer.email)!;
		expect(mail.subject).toBe(`Recall of lot ${raw.code}: 2 batches flagged`);
		expect(mail.textBody).toContain(`${mediumBatch.number} (`);
		expect(mail.textBody).toContain(`through stock ${stockBatch.number}`);
	});

	it('can send a released lot to retest: not usable until a signed retest', async () => {
		const raw = makeLot(lead.actor, {
			component: 'sodium-chloride',
			expiresOn: addDays(today, 400)
		});
		await recallLot(asLead(), raw.id, {
			lotAction: 'retest',
			reason: 'Caking seen on another lot of this supplier',
			password: lead.password
		});
		const due = findLot(raw.id)!;
		expect(due).toMatchObject({ status: 'released', retestOn: today });
		expect(isUsableLot(due, today)).toBe(false);
		const tooLate = await refusalOf(() =>
			recordRetest(asLead(), raw.id, {
				result: 'Assay 99.6 %',
				nextRetestOn: addDays(today, 900),
				password: lead.password
			})
		);
		expect(tooLate.field).toBe('nextRetestOn');
		await recordRetest(asLead(), raw.id, {
			result: 'Assay 99.6 %, free-flowing',
			nextRetestOn: addDays(today, 180),
			password: lead.password
		});
		const retested = findLot(raw.id)!;
		expect(retested.retestOn).toBe(addDays(today, 180));
		expect(isUsableLot(retested, today)).toBe(true);
	});
});
