// A lot due for retest is used again only after a signed retest: the result, and the next retest
// date (or none), recorded with the inventory lead's password.
import { eq } from 'drizzle-orm';
import { isoToday } from '$lib/inventory';
import { may } from '$lib/permissions';
import type { Role } from '$lib/roles';
import { recordAudit } from '../audit';
import { lot } from '../db/schema';
import { RuleError } from '../rule-error';
import { digestOf, refusedSignature, signRecord } from '../signatures';
import { requireLot } from './lots';

export interface RetestInput {
	result: string;
	nextRetestOn: string;
	password: string;
}

export async function recordRetest(
	actor: { id: string; email: string; roles: readonly Role[]; address?: string | null },
	lotId: string,
	input: RetestInput,
	today = isoToday()
): Promise<void> {
	const row = requireLot(lotId);
	const attempt = {
		subjectType: 'lot',
		subjectId: row.id,
		meaning: 'retested',
		detail: { code: row.code }
	};
	if (!may(actor, 'lot.keep'))
		throw refusedSignature(actor, attempt, 'A retest needs the role Inventory lead.');
	const result = input.result.trim();
	if (result.length < 3)
		throw new RuleError('Say what the retest found (the test and its result).', {
			field: 'result'
		});
	const next = input.nextRetestOn.trim();
	if (next && (!/^\d{4}-\d{2}-\d{2}$/.test(next) || next <= today))
		throw new RuleError(
			`Next retest date: give a date after today (${today}), or leave it empty.`,
			{
				field: 'nextRetestOn'
			}
		);
	if (next && next > row.expiresOn)
		throw new RuleError(
			`Next retest date: the lot expires on ${row.expiresOn}; retest before that.`,
			{
				field: 'nextRetestOn'
			}
		);
	const retestOn = next || null;
	await signRecord(
		{
			user: actor,
			password: input.password,
			meaning: 'retested',
			subjectType: 'lot',
			subjectId: row.id,
			subjectDigest: digestOf({ lot: row.code, result, retestOn }),
			comment: result,
			address: actor.address ?? undefined
		},
		(tx) => {
			recordAudit(
				actor,
				{
					action: 'lot.retested',
					subjectType: 'lot',
					subjectId: row.id,
					detail: {
						code: row.code,
						result,
						retestOn,
						changes: { retestOn: { from: row.retestOn, to: retestOn } }
					}
				},
				tx
			);
			tx.update(lot).set({ retestOn }).where(eq(lot.id, row.id)).run();
		}
	);
}
