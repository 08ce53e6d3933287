import { eq } from 'drizzle-orm';
import { recordAudit, type Actor } from '../audit';
import { db, type Db } from '../db';
import { siteSetting } from '../db/schema';

type Reader = Pick<Db, 'select'>;
export const RECEIVER_MAY_NOT_SIGN_KEY = 'lot.receiver_may_not_sign';

/** Whether the person who received a lot is kept from releasing or rejecting it. On unless set off. */
export function receiverMayNotSign(reader: Reader = db): boolean {
	const row = reader
		.select()
		.from(siteSetting)
		.where(eq(siteSetting.key, RECEIVER_MAY_NOT_SIGN_KEY))
		.get();
	return row?.value !== 'off';
}

export function setReceiverMayNotSign(actor: Actor, on: boolean): void {
	const value = on ? 'on' : 'off';
	db.transaction((tx) => {
		const before = receiverMayNotSign(tx);
		tx.insert(siteSetting)
			.values({ key: RECEIVER_MAY_NOT_SIGN_KEY, value })
			.onConflictDoUpdate({ target: siteSetting.key, set: { value, updatedAt: new Date() } })
			.run();
		recordAudit(
			actor,
			{
				action: 'settings.lot_receiver_may_not_sign',
				subjectType: 'site',
				detail: { from: before ? 'on' : 'off', to: value }
			},
			tx
		);
	});
}
