import jsQR from 'jsqr';
import { PNG } from 'pngjs';
import { planBatch } from './batch-helpers';
import { DEMO_PASSWORD, expect, pageAs, test } from './fixtures';
import type { Page } from '@playwright/test';

function decodeQr(dataUrl: string): string | null {
	const png = PNG.sync.read(Buffer.from(dataUrl.split(',')[1], 'base64'));
	return jsQR(new Uint8ClampedArray(png.data), png.width, png.height)?.data ?? null;
}

async function lotCode(page: Page, query: string): Promise<string> {
	const body = await (await page.request.get(`/api/v1/lots?${query}`)).json();
	return body.items[0].code;
}

test.describe('prep technician', () => {
	test.use({ role: 'prep_technician', viewport: { width: 768, height: 1024 } });

	test('opens a batch by scanning its sheet, is refused a wrong and an expired lot, gives a reason out of tolerance, and completes with a signature; a reviewer signs it off', async ({
		page,
		browser,
		baseURL
	}) => {
		// A whole batch from sheet to review: many steps, so more time than one page needs.
		test.slow();
		const id = await planBatch(page, 'Fermenter F3, e2e');

		await page.goto(`/batches/${id}/sheet`);
		const qr = await page.getByTestId('sheet-qr').getAttribute('src');
		const scanned = decodeQr(qr!);
		expect(scanned).toBe(`${baseURL}/batches/${id}`);
		await expect(page.getByRole('heading', { name: 'Handling' })).toBeVisible();

		// The keyboard-wedge scanner types the code into the focused field and presses Enter.
		await page.goto('/batches/open');
		await expect(page.getByLabel('Scanner input')).toBeFocused();
		await page.keyboard.type(scanned!);
		await page.keyboard.press('Enter');
		await expect(page).toHaveURL(new RegExp(`/batches/${id}$`));

		const sodiumChloride = await lotCode(page, 'component=sodium-chloride&status=released');
		const first = page.getByTestId('line-1');
		await first.getByLabel('Scan lot for line 1').fill(sodiumChloride);
		await first.getByLabel('Scan lot for line 1').press('Enter');
		await expect(first.getByRole('alert')).toContainText(
			`Wrong lot: ${sodiumChloride} is Sodium chloride; this line needs Dipotassium hydrogen phosphate`
		);

		const expiredGlucose = await lotCode(
			page,
			'component=d-glucose&expiringBefore=' +
				new Date(Date.now() - 86_400_000).toISOString().slice(0, 10)
		);
		const glucose = page.getByRole('article', { name: /D-Glucose/ });
		await glucose.getByLabel(/Scan lot for line/).fill(expiredGlucose);
		await glucose.getByLabel(/Scan lot for line/).press('Enter');
		await expect(glucose.getByRole('alert')).toContainText(`Lot ${expiredGlucose} is expired`);

		await first.getByLabel('Scan lot for line 1').fill('NO-SUCH-LOT');
		await first.getByLabel('Scan lot for line 1').press('Enter');
		await expect(first.getByRole('alert')).toContainText('“NO-SUCH-LOT” is not a lot known here.');

		const lines = await page
			.locator('[data-testid^="line-"]')
			.filter({ has: page.getByTestId('required') })
			.count();
		for (let n = 1; n <= lines; n++) {
			const card = page.getByTestId(`line-${n}`);
			const suggested = card.getByTestId('suggested-lot');
			if (await suggested.count()) {
				const code = (await suggested.textContent())!;
				await card.getByLabel(`Scan lot for line ${n}`).fill(code);
				await card.getByLabel(`Scan lot for line ${n}`).press('Enter');
				await expect(card.getByTestId('chosen-lot')).toHaveText(code);
			}
			const required = (await card.getByTestId('required').textContent())!.trim();
			const massField = card.getByLabel(new RegExp(`^(Mass|Volume) for line ${n}$`));
			if (n === 1) {
				const grams = Number(required.replace(' g', ''));
				await massField.fill(String(Number((grams * 1.05).toFixed(2))));
				await expect(card.getByTestId('tolerance')).toHaveText('Out of tolerance (above)');
				await expect(card.getByRole('button', { name: 'Sign line 1 as done' })).toBeDisabled();
				await card
					.getByLabel('Deviation reason for line 1')
					.fill('Balance drift noticed; supervisor agreed');
			} else {
				await massField.fill(required);
				await expect(card.getByTestId('tolerance')).toHaveText('In tolerance');
			}
			if (await card.getByLabel(`Stock used for line ${n}`).count())
				await card.getByLabel(`Stock used for line ${n}`).fill('T2 stock bottle 7');
			await card.getByRole('button', { name: `Sign line ${n} as done` }).click();
			await expect(card.getByTestId('line-done')).toBeVisible();
		}
		await expect(page.getByTestId('deviations')).toContainText('Balance drift noticed');

		await page.getByLabel('Measured pH').fill('7.0');
		await page.getByLabel('Measured osmolality (mOsm/kg)').fill('262');
		await page.getByRole('button', { name: 'Record measurements' }).click();
		await expect(page.getByText('Measurements recorded.')).toBeVisible();

		await page.getByLabel('Your password (to sign)').fill('not-my-password');
		await page.getByRole('button', { name: 'Sign as prepared' }).click();
		await expect(page.getByRole('alert').filter({ hasText: 'nothing was signed' })).toBeVisible();
		await page.getByLabel('Your password (to sign)').fill(DEMO_PASSWORD);
		await page.getByRole('button', { name: 'Sign as prepared' }).click();
		await expect(
			page.getByText('Batch signed as prepared; stock was taken from every lot used.')
		).toBeVisible();
		await expect(page.getByText('Prepared', { exact: true })).toBeVisible();

		// The preparer may not review their own batch.
		await expect(page.getByTestId('review-refusal')).toBeVisible();
		const refused = await page.request.post(`/batches/${id}?/review`, {
			form: { decision: 'released', password: DEMO_PASSWORD, reason: '' },
			headers: { origin: baseURL! }
		});
		expect(refused.status()).toBe(403);

		const reviewer = await pageAs(browser, 'media_scientist', baseURL!);
		await reviewer.goto(`/batches/${id}`);
		await expect(reviewer.getByTestId('deviations')).toContainText('Weighing out of tolerance');
		await reviewer
			.getByLabel('Comment (required to reject)')
			.fill('Deviation on line 1 assessed: acceptable.');
		await reviewer.getByLabel('Your password (to sign)').fill(DEMO_PASSWORD);
		await reviewer.getByRole('button', { name: 'Sign the review' }).click();
		await expect(reviewer.getByText('Batch released for use.')).toBeVisible();
		const record = await (await reviewer.request.get(`/api/v1/batches/${id}`)).json();
		expect(record.batch.state).toBe('released');
		expect(record.signatures.map((s: { meaning: string }) => s.meaning)).toEqual([
			'prepared',
			'reviewed and released for use'
		]);
		expect(record.lots.every((l: { consumedQuantity: number }) => l.consumedQuantity > 0)).toBe(
			true
		);
		await reviewer.context().close();
	});

	test('a mass typed ambiguously is refused with the reason and kept; an entry made offline is kept and resent', async ({
		page,
		context
	}) => {
		const id = await planBatch(page, 'Offline check, e2e');
		const card = page.getByTestId('line-1');
		const code = (await card.getByTestId('suggested-lot').textContent())!;
		await card.getByLabel('Scan lot for line 1').fill(code);
		await card.getByLabel('Scan lot for line 1').press('Enter');
		await expect(card.getByTestId('chosen-lot')).toHaveText(code);
		await card.getByLabel('Mass for line 1').fill('7,500');
		await expect(card.getByText('“7,500” is ambiguous')).toBeVisible();
		await expect(card.getByLabel('Mass for line 1')).toHaveValue('7,500');

		const required = (await card.getByTestId('required').textContent())!.trim();
		await card.getByLabel('Mass for line 1').fill(required);
		await context.setOffline(true);
		await card.getByRole('button', { name: 'Sign line 1 as done' }).click();
		await expect(card.getByTestId('line-message')).toContainText(
			'saved on this tablet, will resend'
		);
		// The tablet's page goes away with the entry unsent; a fresh page of the same browser finds it kept
		// and sends it. (Closing the old page first means only the fresh one can be the sender.)
		await page.close();
		await context.setOffline(false);
		const fresh = await context.newPage();
		await fresh.goto(`/batches/${id}`);
		await expect(fresh.getByText(/Back online: 1 saved entry was sent/)).toBeVisible();
		await expect(fresh.getByTestId('line-1').getByTestId('line-done')).toContainText(required);
		// Once sent, no notice says it is still held on the tablet.
		await expect(fresh.getByTestId('line-1').getByText(/saved on this tablet/i)).toHaveCount(0);
	});

	test('the batch sheet downloads as a PDF', async ({ page }) => {
		const id = await planBatch(page, 'PDF check, e2e');
		const response = await page.request.get(`/batches/${id}/sheet.pdf`);
		expect(response.headers()['content-type']).toBe('application/pdf');
		expect(
			Buffer.from(await response.body())
				.subarray(0, 5)
				.toString()
		).toBe('%PDF-');
	});
});
