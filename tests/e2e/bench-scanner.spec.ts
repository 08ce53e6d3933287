// A keyboard-wedge scanner types a code and presses Enter: the batch page must always have the
// right field focused and empty. A whole batch is made here by typed scans, typed masses and
// Enter alone, on a portrait tablet.
import { planBatch } from './batch-helpers';
import { expect, test } from './fixtures';

test.describe('scanner-first batch at the bench', () => {
	test.use({ role: 'prep_technician', viewport: { width: 768, height: 1024 } });

	test('opens with the first line ready for a scan, clears every scan, and moves on line by line', async ({
		page
	}) => {
		// Every line is scanned, weighed and signed: more steps than one page's time.
		test.slow();
		const id = await planBatch(page, 'Scanner bench run');
		await page.goto('/batches/open');
		const opener = page.getByLabel('Scanner input');
		await expect(opener).toBeFocused();
		await page.keyboard.type('L-NOT-A-SHEET');
		await page.keyboard.press('Enter');
		await expect(page.getByText('“L-NOT-A-SHEET” is not a batch sheet known here.')).toBeVisible();
		await expect(opener).toHaveValue('');
		await expect(opener).toBeFocused();
		await page.keyboard.type(`${new URL(page.url()).origin}/batches/${id}`);
		await page.keyboard.press('Enter');
		await expect(page).toHaveURL(new RegExp(`/batches/${id}$`));

		const first = page.getByTestId('line-1');
		const firstScan = first.getByLabel('Scan lot for line 1');
		await expect(firstScan).toBeFocused();

		// A refused code is shown beside the field, which is emptied for the next scan.
		await page.keyboard.type('NO-SUCH-LOT');
		await page.keyboard.press('Enter');
		await expect(first.getByRole('alert')).toContainText('“NO-SUCH-LOT” is not a lot known here.');
		await expect(first.getByTestId('last-scan')).toContainText('NO-SUCH-LOT');
		await expect(firstScan).toHaveValue('');
		await expect(firstScan).toBeFocused();

		const lines = await page.locator('[data-line-open="true"]').count();
		for (let n = 1; n <= lines; n++) {
			const card = page.getByTestId(`line-${n}`);
			const scan = card.getByLabel(`Scan lot for line ${n}`);
			const suggested = card.getByTestId('suggested-lot');
			if (await suggested.count()) {
				await expect(scan).toBeFocused();
				await page.keyboard.type((await suggested.textContent())!);
				await page.keyboard.press('Enter');
				await expect(card.getByTestId('chosen-lot')).toBeVisible();
				await expect(scan).toHaveValue('');
			}
			const mass = card.getByLabel(new RegExp(`^(Mass|Volume) for line ${n}$`));
			await expect(mass).toBeFocused();
			const required = (await card.getByTestId('required').textContent())!.trim();
			// Typed as the sheet gives it, unit and all, but the first line as a bare number in the
			// field's unit: the record then shows the quantity with its unit and what was typed.
			const typed = n === 1 ? required.replace(/\s*(g|mL)$/, '') : required;
			await page.keyboard.type(typed);
			await expect(card.getByTestId('tolerance')).toHaveText('In tolerance');
			await page.keyboard.press('Enter');
			await expect(card.getByTestId('line-done')).toContainText(`Done: ${required}`);
			if (typed !== required)
				await expect(card.getByTestId('line-done')).toContainText(`(typed “${typed}”)`);
			if (n < lines) {
				// Focus has moved on: the next line's mass field when its lot is already chosen, else its scan.
				const next = page.getByTestId(`line-${n + 1}`);
				await expect(
					next.locator('input[data-mass-field], input[data-scan-field]').first()
				).toBeFocused();
			}
		}
		await expect(page.locator('[data-line-open="true"]')).toHaveCount(0);
		await page.screenshot({ path: test.info().outputPath('bench-768x1024.png'), fullPage: true });
	});
});
