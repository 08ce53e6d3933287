import { DEMO_PASSWORD, expect, test } from './fixtures';

// Runs after every other spec (playwright.config.ts): it holds the demo's trace stock.
test.describe('recall', () => {
	test.use({ role: 'inventory_lead' });

	test('one signed act holds a raw lot, flags the medium made through a stock, and holds the stock', async ({
		page
	}) => {
		const lots = await (
			await page.request.get('/api/v1/lots?component=zinc-sulfate-heptahydrate&status=released')
		).json();
		const zinc = lots.items[0];
		await page.goto(`/lots/${zinc.id}/recall`);
		const rows = page.getByRole('table', { name: 'affected batches' }).getByRole('row');
		await expect(rows.filter({ hasText: 'PPN Trace Elements T2' })).toContainText('this lot');
		await expect(rows.filter({ hasText: 'NB-Min Salts 3' }).first()).toContainText(
			/stock MB-\d{4}-\d{4} \(level 2\)/
		);

		const form = page.getByRole('form', { name: 'Recall this lot' });
		await form.getByLabel('Reason for the recall').fill('Supplier notice: wrong hydrate shipped');
		await form.getByLabel('Your password (to sign the recall)').fill('not-it');
		await form.getByRole('button', { name: 'Sign the recall' }).click();
		await expect(
			form.getByText('The password is not right for your account; nothing was signed.')
		).toBeVisible();
		await expect(form.getByLabel('Reason for the recall')).toHaveValue(
			'Supplier notice: wrong hydrate shipped'
		);
		await form.getByLabel('Your password (to sign the recall)').fill(DEMO_PASSWORD);
		await form.getByRole('button', { name: 'Sign the recall' }).click();
		await expect(
			page.getByText(/Recall signed: \d+ batch(es)? flagged, stocks MB-\d{4}-\d{4} put on hold\./)
		).toBeVisible();
		await expect(page.getByRole('region', { name: 'Recalls of this lot' })).toContainText(
			'put on hold'
		);

		// The medium made through the stock says so on its record.
		const medium = rows.filter({ hasText: 'NB-Min Salts 3' }).first().getByRole('link');
		await medium.click();
		await expect(page.getByText('Made from a recalled lot')).toBeVisible();
		await expect(page.getByText(new RegExp(`Lot ${zinc.code} \\(through stock MB-`))).toBeVisible();

		const after = await (await page.request.get(`/api/v1/lots/${zinc.id}`)).json();
		expect(after.lot.status).toBe('quarantine');
	});
});
