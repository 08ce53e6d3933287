import { beforeAll, describe, expect, it } from 'vitest';
import { seedReferenceLibrary } from '$lib/server/components/reference-library';
import { db } from '$lib/server/db';
import { component } from '$lib/server/db/schema';
import { addDays } from '$lib/server/inventory/alerts';
import { lastDigestDate, sendDigestIfDue, sendInventoryDigest } from '$lib/server/inventory/digest';
import { setStockSettings } from '$lib/server/inventory/stock-settings';
import { eq } from 'drizzle-orm';
import { makeUser } from './helpers';
import { makeLead, makeLot, today } from './inventory-fixtures';
import { latestMailTo, useMailStandIn } from './mail';

useMailStandIn();

let lead: Awaited<ReturnType<typeof makeLead>>;
beforeAll(async () => {
	seedReferenceLibrary();
	lead = await makeLead();
});

describe('the inventory digest', () => {
	it('reaches every inventory lead through the SMTP stand-in with expiring lots and low components', async () => {
		const soon = makeLot(lead.actor, {
			component: 'd-glucose',
			expiresOn: addDays(today, 12),
			quantity: '200',
			unit: 'g'
		});
		const later = makeLot(lead.actor, {
			component: 'd-glucose',
			expiresOn: addDays(today, 90),
			quantity: '200',
			unit: 'g'
		});
		setStockSettings(lead.actor, 'd-glucose', { reorderLevelG: 1000, densityGPerMl: null });
		const engineer = await makeUser(['engineer']);
		const { recipients } = await sendInventoryDigest({ days: 30 });
		expect(recipients).toContain(lead.email);
		expect(recipients).not.toContain(engineer.email);
		const mail = latestMailTo(lead.email);
		expect(mail?.subject).toMatch(
			/^Inventory digest \d{4}-\d{2}-\d{2}: 1 expiring, 1 below reorder level$/
		);
		expect(mail?.textBody).toContain(soon.code);
		expect(mail?.textBody).not.toContain(later.code);
		expect(mail?.textBody).toContain(
			'D-Glucose, anhydrous: 400.0 g released and in date, reorder level 1000 g'
		);
		expect(latestMailTo(engineer.email)).toBeUndefined();
		expect(lastDigestDate()).toBe(today);
		expect(
			db.select().from(component).where(eq(component.id, 'd-glucose')).get()?.reorderLevelG
		).toBe(1000);
	});

	it('is sent once a day by the schedule', async () => {
		const noon = new Date(`${today}T12:00:00Z`);
		expect(await sendDigestIfDue(noon)).toBe(false);
		const tomorrow = new Date(`${addDays(today, 1)}T07:00:00Z`);
		expect(await sendDigestIfDue(new Date(`${addDays(today, 1)}T03:00:00Z`))).toBe(false);
		expect(await sendDigestIfDue(tomorrow)).toBe(true);
		expect(lastDigestDate()).toBe(addDays(today, 1));
	});
});
