// Stock is checked when it matters: a planned batch says at once which lines nothing in stock can
// supply, and the inventory lead's overview shows the alerts without opening the inventory page.
import { planBatch } from './batch-helpers';
import { expect, test } from './fixtures';

test.describe('planning', () => {
	test.use({ role: 'prep_technician' });

	test('a batch too large for the stock names each line nothing can supply', async ({ page }) => {
		// 400 L: far more of each salt than the demo lots hold.
		await planBatch(page, 'Planning check, too large', 400);
		const warning = page.getByTestId('unstocked-lines');
		await expect(warning).toBeVisible();
		await expect(warning).toContainText('Dipotassium hydrogen phosphate');
		await expect(warning).toContainText('has enough on hand for this line');
	});
});

test.describe('inventory lead', () => {
	test.use({ role: 'inventory_lead' });

	test('sees the inventory alerts on the overview, each linking to where to act', async ({
		page
	}) => {
		// A lot of its own in quarantine, so the alert is there whatever other tests release.
		const today = new Date().toISOString().slice(0, 10);
		const received = await page.request.post('/api/v1/lots', {
			data: {
				component: 'sodium-chloride',
				supplier: 'Overview check supplies',
				supplierLot: `OV-${Date.now()}`,
				quantity: '250',
				unit: 'g',
				receivedOn: today,
				expiresOn: `${Number(today.slice(0, 4)) + 2}${today.slice(4)}`
			}
		});
		expect(received.status()).toBe(201);
		await page.goto('/');
		const alerts = page.getByTestId('inventory-alerts');
		await expect(
			alerts.getByRole('link', { name: /waits? in quarantine for release/ })
		).toHaveAttribute('href', '/lots?status=quarantine');
		const { total } = await (await page.request.get('/api/v1/lots?status=quarantine')).json();
		await expect(alerts).toContainText(`${total} lot`);
	});
});
