import type { Page } from '@playwright/test';
import { planBatch } from './batch-helpers';
import { DEMO_PASSWORD, SECOND_SCIENTIST, expect, pageAs, test } from './fixtures';

async function chooseSuggestedLot(page: Page, n: number) {
	const card = page.getByTestId(`line-${n}`);
	const code = (await card.getByTestId('suggested-lot').textContent())!;
	await card.getByLabel(`Scan lot for line ${n}`).fill(code);
	await card.getByLabel(`Scan lot for line ${n}`).press('Enter');
	await expect(card.getByTestId('chosen-lot')).toHaveText(code);
	return card;
}

test.describe('weighing at the bench', () => {
	test.use({ role: 'prep_technician', viewport: { width: 768, height: 1024 } });

	test('a gross weighing needs a witness; a signed line is corrected with a signed entry that keeps the original', async ({
		page
	}) => {
		test.slow();
		await planBatch(page, 'Records e2e');
		const card = await chooseSuggestedLot(page, 1);
		const required = (await card.getByTestId('required').textContent())!.trim();
		const grams = Number(required.replace(' g', ''));
		const mass = card.getByLabel('Mass for line 1');

		// A hundred times the amount: a misplaced decimal point.
		await mass.fill(String(grams * 100));
		await card.getByLabel('Deviation reason for line 1').fill('typo test');
		await expect(card.getByLabel('Witness e-mail for line 1')).toBeVisible();
		await expect(card.getByRole('button', { name: 'Sign line 1 as done' })).toBeDisabled();

		// Typed right, the witness fields go away and the line is signed.
		await mass.fill(String(grams));
		await expect(card.getByLabel('Witness e-mail for line 1')).toHaveCount(0);
		await card.getByRole('button', { name: 'Sign line 1 as done' }).click();
		await expect(card.getByTestId('line-done')).toBeVisible();

		// The correction: a new value, its reason and the technician's password.
		const corrections = page.getByRole('region', { name: 'Corrections' });
		const corrected = Number((grams * 1.01).toFixed(3));
		await corrections.getByLabel('Correct value').fill(String(corrected));
		await corrections.getByLabel('Reason for the correction').fill('Printed ticket shows more');
		await corrections.getByLabel('Your password (to sign the correction)').fill('wrong-password');
		await corrections.getByRole('button', { name: 'Sign the correction' }).click();
		await expect(
			corrections.getByText('The password is not right for your account; nothing was corrected.')
		).toBeVisible();
		await expect(corrections.getByLabel('Reason for the correction')).toHaveValue(
			'Printed ticket shows more'
		);
		await corrections.getByLabel('Your password (to sign the correction)').fill(DEMO_PASSWORD);
		await corrections.getByRole('button', { name: 'Sign the correction' }).click();
		await expect(
			page.getByText('Correction signed; the original stays on the record.')
		).toBeVisible();
		await expect(corrections.getByRole('listitem').first()).toContainText(
			`→ ${corrected}, by Demo Prep Technician`
		);
		await expect(corrections.locator('.line-through').first()).toHaveText(String(grams));
	});
});

test.describe('four eyes on recipes', () => {
	test.use({ role: 'media_scientist' });

	test('a second scientist who imports CSV lines into the draft is refused approval', async ({
		page,
		browser,
		baseURL
	}) => {
		test.slow();
		const name = `Four eyes ${Date.now()}`;
		await page.goto('/recipes/new');
		await page.getByLabel('Name').fill(name);
		await page.getByLabel('Kind').selectOption('basal');
		await page.getByRole('button', { name: 'Create and edit' }).click();
		await expect(page.getByRole('heading', { name: `Edit ${name} · version 1` })).toBeVisible();
		const versionPath = new URL(page.url()).pathname.replace(/\/edit$/, '');

		const second = await pageAs(browser, { email: SECOND_SCIENTIST }, baseURL!);
		await second.goto(`${versionPath}/import`);
		await second
			.getByLabel('…or paste the rows (header first)')
			.fill('component,amount,unit\nD-Glucose,50,g/L\nSodium chloride,6,g/L\n');
		await second.getByRole('radio', { name: /^Add after/ }).check();
		await second.getByRole('button', { name: 'Preview' }).click();
		await second.getByRole('button', { name: 'Import 2 rows' }).click();
		await expect(second.getByText('2 lines added to version 1.')).toBeVisible();

		await second.goto(versionPath);
		await second.getByRole('button', { name: 'Submit for review' }).click();
		await expect(second.getByText('Version 1 is submitted for review.')).toBeVisible();
		await expect(
			second.getByText(
				'You edited this version, so someone who did not write it must review and approve it.'
			)
		).toBeVisible();
		await expect(second.getByRole('form', { name: 'Electronic signature' })).toHaveCount(0);
		const forced = await second.request.post(`${versionPath}?/sign`, {
			form: { meaning: 'approved', password: DEMO_PASSWORD, comment: '' },
			headers: { accept: 'application/json', 'x-sveltekit-action': 'true', origin: baseURL! }
		});
		expect(await forced.json()).toMatchObject({ type: 'failure', status: 403 });

		// The engineer, who changed nothing, approves it.
		const engineer = await pageAs(browser, 'engineer', baseURL!);
		await engineer.goto(versionPath);
		const form = engineer.getByRole('form', { name: 'Electronic signature' });
		await form.getByLabel('Approved: this version is released for use').check();
		await form.getByLabel('Your password').fill(DEMO_PASSWORD);
		await form.getByRole('button', { name: 'Sign' }).click();
		await expect(engineer.getByTestId('status').first()).toHaveText('Approved');
		await second.context().close();
		await engineer.context().close();
	});
});
