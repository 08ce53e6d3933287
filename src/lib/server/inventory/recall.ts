// A recall is one signed act: the lot is put on hold (back to quarantine) or sent to retest, every
// batch made from it at any depth through stocks is flagged, every stock made from it still in stock
// is put on hold, and the inventory leads and the reviewers are told by mail.
import { and, desc, eq, inArray } from 'drizzle-orm';
import { isoToday } from '$lib/inventory';
import { may } from '$lib/permissions';
import type { Role } from '$lib/roles';
import { recordAudit } from '../audit';
import { config } from '../config';
import { db } from '../db';
import { idSlices } from '../db/id-slices';
import { batchRecallFlag, lot, lotRecall, user, userRole, type Lot } from '../db/schema';
import { sendMail } from '../mail/send';
import { RuleError } from '../rule-error';
import { digestOf, refusedSignature, signRecord } from '../signatures';
import { onHandColumn, type Tx } from './ledger';
import { requireLot } from './lots';
import { batchesMadeFromLot, type TracedUse } from './where-used';

export const RECALL_LOT_ACTIONS = ['hold', 'retest'] as const;
export type RecallLotAction = (typeof RECALL_LOT_ACTIONS)[number];

export interface RecallInput {
	lotAction: string;
	reason: string;
	password: string;
}

export interface RecallOutcome {
	recallId: string;
	flagged: TracedUse[];
	heldStocks: string[];
	/** Who was told by mail, or why nobody could be. */
	mailed: string[];
	mailProblem: string | null;
}

function holdLot(tx: Tx, actor: { id: string; email: string }, row: Lot, reason: string) {
	if (row.status !== 'released') return false;
	tx.update(lot)
		.set({
			status: 'quarantine',
			statusReason: reason,
			statusChangedAt: new Date(),
			statusChangedById: actor.id
		})
		.where(eq(lot.id, row.id))
		.run();
	recordAudit(
		actor,
		{
			action: 'lot.held',
			subjectType: 'lot',
			subjectId: row.id,
			detail: {
				code: row.code,
				changes: { status: { from: row.status, to: 'quarantine' } },
				reason
			}
		},
		tx
	);
	return true;
}

/** The lot itself: on hold, or due for retest from today; with the recall's audit entry. */
function actOnRecalledLot(
	tx: Tx,
	actor: { id: string; email: string },
	row: Lot,
	action: RecallLotAction,
	reason: string,
	today: string,
	summary: { recallId: string; flagged: number }
) {
	const retestOn = action === 'retest' ? today : row.retestOn;
	// The trigger that guards retest dates reads this entry, so it comes before the change.
	recordAudit(
		actor,
		{
			action: 'lot.recalled',
			subjectType: 'lot',
			subjectId: row.id,
			detail: { code: row.code, lotAction: action, reason, retestOn, ...summary }
		},
		tx
	);
	if (action === 'hold') holdLot(tx, actor, row, `Recall: ${reason}`);
	else tx.update(lot).set({ retestOn }).where(eq(lot.id, row.id)).run();
}

/** Stocks made from the lot (at any depth) that still hold something: on hold too. */
function holdStocksMadeFrom(
	tx: Tx,
	actor: { id: string; email: string },
	flagged: TracedUse[],
	reason: string
): string[] {
	const made: (Lot & { onHand: number })[] = [];
	for (const slice of idSlices(flagged.map((f) => f.batchId))) {
		for (const { row, onHand } of tx
			.select({ row: lot, onHand: onHandColumn })
			.from(lot)
			.where(inArray(lot.sourceBatchId, slice))
			.all())
			made.push({ ...row, onHand });
	}
	return made.filter((m) => m.onHand > 0 && holdLot(tx, actor, m, reason)).map((m) => m.code);
}

function recipientsOfRecall(): string[] {
	const rows = db
		.select({ email: user.email, role: userRole.role })
		.from(user)
		.innerJoin(userRole, eq(userRole.userId, user.id))
		.where(and(eq(user.active, true), eq(user.kind, 'person')))
		.all();
	return [
		...new Set(
			rows
				.filter((r) => may([r.role as Role], 'lot.keep') || may([r.role as Role], 'batch.review'))
				.map((r) => r.email)
		)
	].sort();
}

function recallMail(
	row: Lot,
	action: RecallLotAction,
	reason: string,
	outcome: Omit<RecallOutcome, 'mailed' | 'mailProblem'>
) {
	const link = `${config.origin}/lots/${row.id}/recall`;
	const batches = outcome.flagged.map(
		(f) =>
			`${f.batchNumber} (${f.recipeName}, ${f.state}${f.viaLotCode ? `, through stock ${f.viaLotCode}` : ''})`
	);
	return {
		subject: `Recall of lot ${row.code}: ${outcome.flagged.length} batch${outcome.flagged.length === 1 ? '' : 'es'} flagged`,
		text: [
			`Lot ${row.code} was recalled: ${reason}`,
			action === 'hold'
				? 'The lot is on hold (quarantine).'
				: 'The lot may not be used until it is retested.',
			outcome.flagged.length
				? `Batches made from it:\n${batches.map((b) => `- ${b}`).join('\n')}`
				: 'No batch was made from it.',
			outcome.heldStocks.length
				? `Stocks made from it put on hold: ${outcome.heldStocks.join(', ')}`
				: '',
			`Follow the site's recall procedure. Details: ${link}`
		]
			.filter(Boolean)
			.join('\n\n')
	};
}

type Recaller = { id: string; email: string; roles: readonly Role[]; address?: string | null };

/** The recall's reason and what happens to the lot; each refusal before signing is recorded. */
function checkRecall(actor: Recaller, row: Lot, input: RecallInput) {
	const attempt = {
		subjectType: 'lot',
		subjectId: row.id,
		meaning: 'recalled',
		detail: { code: row.code }
	};
	if (!may(actor, 'lot.keep'))
		throw refusedSignature(actor, attempt, 'A recall needs the role Inventory lead.');
	const reason = input.reason.trim();
	if (reason.length < 3) {
		recordAudit(actor, {
			action: 'lot.recall_refused',
			subjectType: 'lot',
			subjectId: row.id,
			detail: { code: row.code, reason: 'no reason given' }
		});
		throw new RuleError('Give the reason for the recall; it goes to everyone told of it.', {
			field: 'reason'
		});
	}
	if (!(RECALL_LOT_ACTIONS as readonly string[]).includes(input.lotAction))
		throw new RuleError('Choose what happens to the lot: on hold, or retest before use.', {
			field: 'lotAction'
		});
	return { reason, action: input.lotAction as RecallLotAction };
}

/** Inside the signature's transaction: the recall, its flags, the lot and the stocks made from it. */
function writeRecall(
	tx: Tx,
	actor: Recaller,
	row: Lot,
	recall: { action: RecallLotAction; reason: string; signatureId: string; today: string },
	flagged: TracedUse[]
) {
	const { action, reason, signatureId, today } = recall;
	const { id: recallId } = tx
		.insert(lotRecall)
		.values({ lotId: row.id, lotAction: action, reason, recalledById: actor.id, signatureId })
		.returning()
		.get();
	for (const f of flagged)
		tx.insert(batchRecallFlag)
			.values({ recallId, batchId: f.batchId, depth: f.depth, viaLotCode: f.viaLotCode })
			.run();
	actOnRecalledLot(tx, actor, requireLot(row.id, tx), action, reason, today, {
		recallId,
		flagged: flagged.length
	});
	const heldStocks = holdStocksMadeFrom(
		tx,
		actor,
		flagged,
		`Made from recalled lot ${row.code}: ${reason}`
	);
	return { recallId, flagged, heldStocks };
}

/** After the recall is recorded: the mail; a failure to send is recorded and said, not thrown. */
async function tellOfRecall(
	actor: Recaller,
	row: Lot,
	recall: { action: RecallLotAction; reason: string },
	outcome: Omit<RecallOutcome, 'mailed' | 'mailProblem'>
): Promise<RecallOutcome> {
	const mailed = recipientsOfRecall();
	try {
		if (mailed.length)
			await sendMail({ to: mailed, ...recallMail(row, recall.action, recall.reason, outcome) });
		return { ...outcome, mailed, mailProblem: null };
	} catch (cause) {
		const problem = `The recall is recorded, but the mail could not be sent (${(cause as Error).message}); tell the people concerned another way.`;
		recordAudit(actor, {
			action: 'lot.recall_mail_failed',
			subjectType: 'lot',
			subjectId: row.id,
			detail: { problem }
		});
		return { ...outcome, mailed: [], mailProblem: problem };
	}
}

/**
 * The recall: refused without the role, a reason or the right password (each refusal recorded),
 * then one transaction for the signature, the lot, the flags and the held stocks; mail after.
 */
export async function recallLot(
	actor: Recaller,
	lotId: string,
	input: RecallInput,
	today = isoToday()
): Promise<RecallOutcome> {
	const row = requireLot(lotId);
	const { reason, action } = checkRecall(actor, row, input);
	const flagged = batchesMadeFromLot(row.id);
	const outcome = await signRecord(
		{
			user: actor,
			password: input.password,
			meaning: 'recalled',
			subjectType: 'lot',
			subjectId: row.id,
			subjectDigest: digestOf({
				lot: row.code,
				action,
				reason,
				batches: flagged.map((f) => f.batchNumber)
			}),
			comment: reason,
			address: actor.address ?? undefined
		},
		(tx, signature) =>
			writeRecall(tx, actor, row, { action, reason, signatureId: signature.id, today }, flagged)
	);
	return tellOfRecall(actor, row, { action, reason }, outcome);
}

/** The recalls of a lot, newest first, with who made them. */
export function recallsOf(lotId: string) {
	return db
		.select({
			id: lotRecall.id,
			lotAction: lotRecall.lotAction,
			reason: lotRecall.reason,
			at: lotRecall.at,
			byName: user.name
		})
		.from(lotRecall)
		.innerJoin(user, eq(user.id, lotRecall.recalledById))
		.where(eq(lotRecall.lotId, lotId))
		.orderBy(desc(lotRecall.at))
		.all();
}

/** Why a batch is flagged: each recall of a lot it was made from, with the lot's code. */
export function recallFlagsOf(batchId: string) {
	return db
		.select({
			lotCode: lot.code,
			lotId: lot.id,
			reason: lotRecall.reason,
			at: lotRecall.at,
			depth: batchRecallFlag.depth,
			viaLotCode: batchRecallFlag.viaLotCode
		})
		.from(batchRecallFlag)
		.innerJoin(lotRecall, eq(lotRecall.id, batchRecallFlag.recallId))
		.innerJoin(lot, eq(lot.id, lotRecall.lotId))
		.where(and(eq(batchRecallFlag.batchId, batchId)))
		.orderBy(desc(lotRecall.at))
		.all();
}
