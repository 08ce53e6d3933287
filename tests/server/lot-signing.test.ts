import { createHash } from 'node:crypto';
import { eq } from 'drizzle-orm';
import { beforeAll, describe, expect, it } from 'vitest';
import { auditEventsFor } from '$lib/server/audit';
import { seedReferenceLibrary } from '$lib/server/components/reference-library';
import { db } from '$lib/server/db';
import { eSignature, lotCertificate } from '$lib/server/db/schema';
import { receiverMayNotSign, setReceiverMayNotSign } from '$lib/server/inventory/lot-settings';
import { lotDigest, lotSigningRefusal, signLotDecision } from '$lib/server/inventory/lot-signing';
import { findLot } from '$lib/server/inventory/lots';
import { RuleError } from '$lib/server/rule-error';
import { makeUser } from './helpers';
import { makeLead, makeLot } from './inventory-fixtures';

let receiver: Awaited<ReturnType<typeof makeLead>>;
let checker: Awaited<ReturnType<typeof makeLead>>;
beforeAll(async () => {
	seedReferenceLibrary();
	receiver = await makeLead();
	checker = await makeLead();
});

function signaturesOn(lotId: string) {
	return db.select().from(eSignature).where(eq(eSignature.subjectId, lotId)).all();
}

async function refusal(run: Promise<unknown>): Promise<RuleError> {
	const caught = await run.then(
		() => null,
		(cause: unknown) => cause
	);
	expect(caught).toBeInstanceOf(RuleError);
	return caught as RuleError;
}

describe('a lot release signature', () => {
	it('by someone other than the receiver, with the right password: signed, released and audited', async () => {
		const held = makeLot(receiver.actor, { status: 'quarantine', assayPercent: '99.4' });
		await signLotDecision(checker, held.id, {
			decision: 'released',
			password: checker.password,
			reason: 'Certificate checked.'
		});
		const after = findLot(held.id)!;
		expect(after.status).toBe('released');
		expect(after.statusChangedById).toBe(checker.id);
		const [signature] = signaturesOn(held.id);
		expect(signature).toMatchObject({
			signerId: checker.id,
			meaning: 'released for use',
			subjectType: 'lot',
			comment: 'Certificate checked.'
		});
		// The digest recomputed here by hand from the stored row and certificate, with node:crypto.
		const certificate = db
			.select()
			.from(lotCertificate)
			.where(eq(lotCertificate.lotId, held.id))
			.get()!;
		const byHand = createHash('sha256')
			.update(
				JSON.stringify({
					code: after.code,
					componentId: after.componentId,
					supplier: after.supplier,
					supplierLot: after.supplierLot,
					receivedOn: after.receivedOn,
					expiresOn: after.expiresOn,
					dateKind: after.dateKind,
					quantityKind: after.quantityKind,
					receivedQuantity: after.receivedQuantity,
					receivedUnit: after.receivedUnit,
					assayPercent: 99.4,
					purityPercent: null,
					waterContentPercent: null,
					certificates: [certificate.sha256]
				})
			)
			.digest('hex');
		expect(signature.subjectDigest).toBe(byHand);
		expect(lotDigest(after)).toBe(byHand);
		const actions = auditEventsFor('lot', held.id).map((e) => e.action);
		expect(actions).toContain('lot.released');
		expect(actions).toContain('signature.recorded');
	});

	it('is refused for the receiver while the site setting is on, and the refusal is in the trail', async () => {
		expect(receiverMayNotSign()).toBe(true);
		const held = makeLot(receiver.actor, { status: 'quarantine' });
		const error = await refusal(
			signLotDecision(receiver, held.id, {
				decision: 'released',
				password: receiver.password,
				reason: ''
			})
		);
		expect(error.status).toBe(403);
		expect(error.message).toBe('You received this lot, so someone else must release it.');
		expect(findLot(held.id)?.status).toBe('quarantine');
		expect(signaturesOn(held.id)).toHaveLength(0);
		const refused = auditEventsFor('lot', held.id).find((e) => e.action === 'signature.refused');
		expect(refused?.actorId).toBe(receiver.id);
		expect(refused?.detail).toMatchObject({
			meaning: 'released for use',
			reason: 'You received this lot, so someone else must release it.'
		});
		const rejection = await refusal(
			signLotDecision(receiver, held.id, {
				decision: 'rejected',
				password: receiver.password,
				reason: 'Label torn.'
			})
		);
		expect(rejection.message).toBe('You received this lot, so someone else must reject it.');
	});

	it('is allowed for the receiver when the site setting is off', async () => {
		const admin = await makeUser(['admin']);
		setReceiverMayNotSign({ id: admin.id, email: admin.email }, false);
		try {
			const held = makeLot(receiver.actor, { status: 'quarantine' });
			expect(lotSigningRefusal(receiver, findLot(held.id)!, 'released')).toBeNull();
			await signLotDecision(receiver, held.id, {
				decision: 'released',
				password: receiver.password,
				reason: ''
			});
			expect(findLot(held.id)?.status).toBe('released');
			expect(signaturesOn(held.id).map((s) => s.signerId)).toEqual([receiver.id]);
		} finally {
			setReceiverMayNotSign({ id: admin.id, email: admin.email }, true);
		}
		expect(receiverMayNotSign()).toBe(true);
	});

	it('with a wrong password is refused at the password field and recorded; nothing changes', async () => {
		const held = makeLot(receiver.actor, { status: 'quarantine' });
		const error = await refusal(
			signLotDecision(checker, held.id, {
				decision: 'released',
				password: 'not-my-password',
				reason: ''
			})
		);
		expect(error.field).toBe('password');
		expect(findLot(held.id)?.status).toBe('quarantine');
		expect(signaturesOn(held.id)).toHaveLength(0);
		const refused = auditEventsFor('lot', held.id).find((e) => e.action === 'signature.refused');
		expect(refused?.detail).toMatchObject({
			meaning: 'released for use',
			reason: 'wrong password'
		});
	});

	it('to reject without a reason is refused at the reason field before the password is checked', async () => {
		const held = makeLot(receiver.actor, { status: 'quarantine' });
		const error = await refusal(
			signLotDecision(checker, held.id, {
				decision: 'rejected',
				password: checker.password,
				reason: ' '
			})
		);
		expect(error.field).toBe('reason');
		expect(error.message).toMatch(/^Reason: /);
		expect(findLot(held.id)?.status).toBe('quarantine');
		expect(signaturesOn(held.id)).toHaveLength(0);
		await signLotDecision(checker, held.id, {
			decision: 'rejected',
			password: checker.password,
			reason: 'Seal broken on arrival.'
		});
		expect(findLot(held.id)?.status).toBe('rejected');
		expect(signaturesOn(held.id).map((s) => s.meaning)).toEqual(['rejected']);
	});

	it('is refused for someone without the inventory lead role', async () => {
		const scientist = await makeUser(['media_scientist']);
		const held = makeLot(receiver.actor, { status: 'quarantine' });
		const error = await refusal(
			signLotDecision(scientist, held.id, {
				decision: 'released',
				password: scientist.password,
				reason: ''
			})
		);
		expect(error.status).toBe(403);
		expect(findLot(held.id)?.status).toBe('quarantine');
	});
});
