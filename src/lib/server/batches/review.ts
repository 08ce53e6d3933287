import { and, eq } from 'drizzle-orm';
import { BATCH_STATE_LABELS } from '$lib/batches';
import { may } from '$lib/permissions';
import type { Role } from '$lib/roles';
import { recordAudit } from '../audit';
import { db } from '../db';
import { batch, batchLine, type Batch } from '../db/schema';
import { RuleError } from '../rule-error';
import { refusedSignature, signRecord } from '../signatures';
import { batchDigest } from './completion';
import { requireBatch } from './execution';
import { createStockLot } from './stock-lots';

/** Why this person may not review the batch, or null when they may. */
export function reviewRefusal(
	reviewer: { id: string; roles: readonly Role[] },
	b: Batch
): string | null {
	if (!may(reviewer, 'batch.review'))
		return 'Reviewing a batch needs the role Media scientist or Process engineer.';
	if (b.preparedById === reviewer.id)
		return 'You prepared this batch, so someone else must review it.';
	const signedLine = db
		.select({ id: batchLine.id })
		.from(batchLine)
		.where(and(eq(batchLine.batchId, b.id), eq(batchLine.doneById, reviewer.id)))
		.get();
	if (signedLine) return 'You signed lines of this batch, so someone else must review it.';
	return null;
}

/** The reviewer's electronic signature: released for use, or rejected with a reason. */
export async function reviewBatch(
	reviewer: { id: string; email: string; roles: readonly Role[]; address?: string | null },
	batchId: string,
	input: { decision: string; password: string; reason: string }
): Promise<void> {
	const b = requireBatch(batchId);
	if (b.state !== 'prepared')
		throw new RuleError(
			`Batch ${b.number} is ${BATCH_STATE_LABELS[b.state].toLowerCase()}; only a prepared batch is reviewed.`,
			{ status: 409 }
		);
	const refusal = reviewRefusal(reviewer, b);
	if (refusal) {
		throw refusedSignature(
			reviewer,
			{
				subjectType: 'batch',
				subjectId: b.id,
				meaning: input.decision,
				detail: { number: b.number }
			},
			refusal
		);
	}
	if (input.decision !== 'released' && input.decision !== 'rejected')
		throw new RuleError('Choose: release for use, or reject.', { field: 'decision' });
	const reason = input.reason.trim();
	if (input.decision === 'rejected' && reason.length < 3)
		throw new RuleError('Give the reason for rejecting the batch.', { field: 'reason' });
	const decision = input.decision;
	await signRecord(
		{
			user: reviewer,
			password: input.password,
			meaning: decision === 'released' ? 'reviewed and released for use' : 'reviewed and rejected',
			subjectType: 'batch',
			subjectId: b.id,
			subjectDigest: batchDigest(b),
			comment: reason,
			address: reviewer.address ?? undefined
		},
		(tx) => {
			const now = requireBatch(batchId, tx);
			if (now.state !== 'prepared')
				throw new RuleError('Someone reviewed this batch meanwhile; nothing was signed.', {
					status: 409
				});
			tx.update(batch)
				.set({
					state: decision,
					reviewedById: reviewer.id,
					reviewedAt: new Date(),
					reviewNote: reason
				})
				.where(eq(batch.id, b.id))
				.run();
			recordAudit(
				{ id: reviewer.id, email: reviewer.email, address: reviewer.address ?? null },
				{
					action: `batch.${decision}`,
					subjectType: 'batch',
					subjectId: b.id,
					detail: { number: b.number, reason }
				},
				tx
			);
			// A released stock solution becomes a lot that later batches scan.
			if (decision === 'released')
				createStockLot(tx, { id: reviewer.id, email: reviewer.email }, now);
		}
	);
}
