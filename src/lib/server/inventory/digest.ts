import { and, eq } from 'drizzle-orm';
import {
	DEFAULT_EXPIRY_WINDOW_DAYS,
	formatQuantity,
	isoToday,
	type QuantityKind
} from '$lib/inventory';
import { recordAudit } from '../audit';
import { config } from '../config';
import { db } from '../db';
import { siteSetting, user, userRole } from '../db/schema';
import { sendMail, type OutgoingMail } from '../mail/send';
import { settingText } from '../site-settings';
import { componentsBelowReorder, expiringLots } from './alerts';

export const DIGEST_SENT_KEY = 'inventory.digest_last_sent_on';

export interface InventoryDigest {
	today: string;
	days: number;
	expiring: ReturnType<typeof expiringLots>;
	low: ReturnType<typeof componentsBelowReorder>;
}

export function buildDigest(
	days = DEFAULT_EXPIRY_WINDOW_DAYS,
	today = isoToday()
): InventoryDigest {
	return { today, days, expiring: expiringLots(days, today), low: componentsBelowReorder(today) };
}

function escapeHtml(text: string): string {
	return text.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);
}

export function digestMail(digest: InventoryDigest, to: string[]): OutgoingMail {
	const expiring = digest.expiring.lots.map(
		(l) =>
			`${l.code} · ${l.componentName} · ${l.supplier} ${l.supplierLot} · ${l.dateKind} ${l.expiresOn} (${l.daysLeft < 0 ? `${-l.daysLeft} days ago` : l.daysLeft === 0 ? 'today' : `in ${l.daysLeft} days`}) · ${formatQuantity(l.onHand, l.quantityKind as QuantityKind)} on hand · ${l.status}`
	);
	const more = digest.expiring.total - expiring.length;
	const low = digest.low.map(
		(c) =>
			`${c.componentName}: ${c.usableG.toFixed(1)} g released and in date, reorder level ${c.reorderLevelG} g`
	);
	const sections = [
		`Inventory digest for ${digest.today}, Pilot Plant North.`,
		`Expiring or due for retest within ${digest.days} days (${digest.expiring.total}):`,
		...(expiring.length ? expiring.map((l) => `  - ${l}`) : ['  none']),
		...(more ? [`  … and ${more} more: see the inventory page`] : []),
		`Below reorder level (${low.length}):`,
		...(low.length ? low.map((l) => `  - ${l}`) : ['  none'])
	];
	const link = `${config.origin}/inventory`;
	const list = (items: string[]) =>
		items.length
			? `<ul>${items.map((i) => `<li>${escapeHtml(i)}</li>`).join('')}</ul>`
			: '<p>none</p>';
	return {
		to,
		subject: `Inventory digest ${digest.today}: ${digest.expiring.total} expiring, ${low.length} below reorder level`,
		text: `${sections.join('\n')}\n\nOpen the dashboard: ${link}\n`,
		html: `<div style="font-family:sans-serif;max-width:40rem"><p>${escapeHtml(sections[0])}</p>
<h3>Expiring or due for retest within ${digest.days} days (${digest.expiring.total})</h3>${list(more ? [...expiring, `… and ${more} more: see the inventory page`] : expiring)}
<h3>Below reorder level</h3>${list(low)}
<p><a href="${escapeHtml(link)}">Open the inventory dashboard</a></p></div>`
	};
}

export function inventoryLeadAddresses(): string[] {
	const rows = db
		.select({ email: user.email })
		.from(user)
		.innerJoin(userRole, eq(userRole.userId, user.id))
		.where(and(eq(userRole.role, 'inventory_lead'), eq(user.active, true), eq(user.kind, 'person')))
		.all();
	return [...new Set(rows.map((r) => r.email))];
}

export class MailUnreachableError extends Error {}

/** Builds the digest and mails it to every active inventory lead; remembers the day it was sent. */
export async function sendInventoryDigest(
	options: { days?: number; today?: string } = {}
): Promise<{ recipients: string[]; digest: InventoryDigest }> {
	const digest = buildDigest(options.days, options.today);
	const recipients = inventoryLeadAddresses();
	if (recipients.length === 0) return { recipients, digest };
	try {
		await sendMail(digestMail(digest, recipients));
	} catch (cause) {
		const code = (cause as NodeJS.ErrnoException).code;
		if (
			code === 'ECONNREFUSED' ||
			code === 'ESOCKET' ||
			code === 'ETIMEDOUT' ||
			code === 'ECONNECTION'
		) {
			const smtp = config.smtp;
			throw new MailUnreachableError(
				smtp.standIn
					? `No mail server answers on ${smtp.host}:${smtp.port}. Start the stand-in with \`npm start\` in another terminal, or set SMTP_HOST to a real relay.`
					: `The mail relay ${smtp.host}:${smtp.port} does not answer (${code}).`
			);
		}
		throw cause;
	}
	db.transaction((tx) => {
		tx.insert(siteSetting)
			.values({ key: DIGEST_SENT_KEY, value: digest.today })
			.onConflictDoUpdate({
				target: siteSetting.key,
				set: { value: digest.today, updatedAt: new Date() }
			})
			.run();
		recordAudit(
			{ id: null, email: null },
			{
				action: 'inventory.digest_sent',
				subjectType: 'site',
				detail: { recipients, expiring: digest.expiring.total, low: digest.low.length }
			},
			tx
		);
	});
	return { recipients, digest };
}

export function lastDigestDate(): string | null {
	return settingText(DIGEST_SENT_KEY) ?? null;
}

/** For the schedule: send once per day, at the first check on or after `hourUtc`. */
export async function sendDigestIfDue(now = new Date(), hourUtc = 6): Promise<boolean> {
	const today = isoToday(now);
	if (now.getUTCHours() < hourUtc || lastDigestDate() === today) return false;
	await sendInventoryDigest({ today });
	return true;
}
