import type { Actor } from '../audit';
import { db, type Db } from '../db';
import { settingText, storeSetting } from '../site-settings';

type Reader = Pick<Db, 'select'>;
export const RECEIVER_MAY_NOT_SIGN_KEY = 'lot.receiver_may_not_sign';

/** Whether the person who received a lot is kept from releasing or rejecting it. On unless set off. */
export function receiverMayNotSign(reader: Reader = db): boolean {
	return settingText(RECEIVER_MAY_NOT_SIGN_KEY, reader) !== 'off';
}

export function setReceiverMayNotSign(actor: Actor, on: boolean): void {
	storeSetting(
		actor,
		{
			key: RECEIVER_MAY_NOT_SIGN_KEY,
			value: on ? 'on' : 'off',
			action: 'settings.lot_receiver_may_not_sign'
		},
		(stored) => (stored === 'off' ? 'off' : 'on')
	);
}
