import { expect, test } from './fixtures';

// One way to read a number (src/lib/number-reading.ts), seen where an inventory lead types one: the
// value as read beside the field, a thousands separator refused with its reason and kept in the field.
test.describe('numbers typed on the receive form', () => {
	test.use({ role: 'inventory_lead' });

	test('shows the value as read, refuses “1,500” as ambiguous and keeps it in the field', async ({
		page
	}) => {
		await page.goto('/lots/receive');
		const quantity = page.getByLabel('Quantity received');
		const readAs = page.locator('#field-quantity-read');
		await page.getByLabel('Unit').selectOption('g');
		await quantity.fill('1500');
		await expect(readAs).toHaveText('read as 1500 g');
		await quantity.fill('1,500');
		await expect(readAs).toHaveText(
			'Quantity received: “1,500” is ambiguous: it could be 1.5 or 1500. This site writes decimals with a point and no thousands separator: type 1500 or 1.5.'
		);
		await quantity.fill('2.5');
		await page.getByLabel('Unit').selectOption('kg');
		await expect(readAs).toHaveText('read as 2.5 kg');
		// Everything else as the form needs it, so the number alone is refused (and nothing received).
		await page.getByLabel('Component').selectOption('sodium-chloride');
		await page.getByLabel('Supplier', { exact: true }).fill('Calder Lab Supply');
		await page.getByLabel('Supplier lot').fill('NUM-READ-1');
		await page.getByLabel('Expiry or retest date').fill('2030-01-31');
		await quantity.fill('1,500');
		await page.getByRole('button', { name: /Receive/ }).click();
		await expect(page.locator('#field-quantity-error')).toContainText('“1,500” is ambiguous');
		await expect(quantity).toHaveValue('1,500');
		await expect(quantity).toHaveAttribute('aria-invalid', 'true');
	});
});

test.describe('the site decimal mark', () => {
	test.use({ role: 'admin' });

	test('is a setting with two choices, the point by default', async ({ page }) => {
		await page.goto('/admin/settings');
		const form = page.locator('form', {
			has: page.getByRole('heading', { name: 'Numbers', exact: true })
		});
		await expect(form.getByLabel('Point (1.5)')).toBeChecked();
		await expect(form.getByLabel('Comma (1,5)')).not.toBeChecked();
		await form.getByRole('button', { name: 'Save' }).click();
		await expect(form.getByText('Saved. Numbers are now read with a decimal point.')).toBeVisible();
		// Hard band, a hand-laid number field, shows its reading too.
		const band = page.getByLabel('Hard band (%)');
		await band.fill('10,5');
		await expect(band.locator('xpath=following-sibling::p[1]')).toContainText('decimal comma');
	});
});
