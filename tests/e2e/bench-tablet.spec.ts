import { planBatch } from './batch-helpers';
import { expect, test } from './fixtures';

// The technician's page on a portrait tablet: the first open line's scan field shows without
// scrolling past the cautions, and once a lot is checked its mass field and sign button are on
// screen. The stock with the most hazardous components, so the cautions are at their longest.
test.describe('the bench page on a portrait tablet', () => {
	test.use({ role: 'prep_technician', viewport: { width: 768, height: 1024 } });

	test('shows the current line’s scan, mass and sign controls without scrolling past cautions', async ({
		page
	}, testInfo) => {
		const id = await planBatch(page, 'Tablet layout, e2e', 1, 'PPN Trace Elements T2 · version 1');
		await page.goto(`/batches/${id}`);
		const scan = page.getByTestId('line-1').getByRole('textbox', { name: 'Scan lot for line 1' });
		await expect(scan).toBeFocused();
		expect(await page.evaluate(() => window.scrollY)).toBe(0);
		const box = (await scan.boundingBox())!;
		expect(box.y + box.height).toBeLessThanOrEqual(1024);
		await expect(page.getByTestId('preparation-cautions')).toBeVisible();
		const opening = testInfo.outputPath('bench-768x1024-opening.png');
		await page.screenshot({ path: opening });
		await testInfo.attach('bench page, 768×1024, on opening', {
			path: opening,
			contentType: 'image/png'
		});

		// The first-to-expire lot, as the line suggests it, typed as a scanner would.
		const suggested = (await page
			.getByTestId('line-1')
			.getByTestId('suggested-lot')
			.textContent())!;
		await page.keyboard.type(suggested.trim());
		await page.keyboard.press('Enter');
		const mass = page.getByTestId('line-1').getByRole('textbox', { name: 'Mass for line 1' });
		await expect(mass).toBeFocused();
		await expect(mass).toBeInViewport({ ratio: 1 });
		await expect(
			page.getByTestId('line-1').getByRole('button', { name: 'Sign line 1 as done' })
		).toBeInViewport({ ratio: 1 });
		const checked = testInfo.outputPath('bench-768x1024-lot-checked.png');
		await page.screenshot({ path: checked });
		await testInfo.attach('bench page, 768×1024, lot checked', {
			path: checked,
			contentType: 'image/png'
		});
	});
});
