// Site settings (`site_setting`): the one way to read a stored value and to change it with its
// audit entry (old and new value, as each setting shows them).
import { eq } from 'drizzle-orm';
import { recordAudit, type Actor } from './audit';
import { db, type Db } from './db';
import { siteSetting } from './db/schema';

type Reader = Pick<Db, 'select'>;

/** The stored text of a setting, or undefined when it was never set. */
export function settingText(key: string, reader: Reader = db): string | undefined {
	return reader.select().from(siteSetting).where(eq(siteSetting.key, key)).get()?.value;
}

/**
 * Stores a setting and audits the change in one transaction. `shown` turns a stored text (or
 * undefined: the default) into the value the audit entry records on both sides.
 */
export function storeSetting(
	actor: Actor,
	setting: { key: string; value: string; action: string },
	shown: (stored: string | undefined) => unknown = (stored) => stored
): void {
	const { key, value, action } = setting;
	db.transaction((tx) => {
		const before = shown(settingText(key, tx));
		tx.insert(siteSetting)
			.values({ key, value })
			.onConflictDoUpdate({ target: siteSetting.key, set: { value, updatedAt: new Date() } })
			.run();
		recordAudit(
			actor,
			{ action, subjectType: 'site', detail: { from: before, to: shown(value) } },
			tx
		);
	});
}
