import { expect, test } from './fixtures';

// The site setting `simulation.time_limit_s` on the admin settings page. Only values of at least the
// 10 s default are saved here: the other browser tests run simulations meanwhile.
test.describe('an administrator sets the time limit per simulation run', () => {
	test.use({ role: 'admin' });

	test('a value that is not seconds is refused at the field, keeping what was typed; a good one is saved', async ({
		page
	}) => {
		await page.goto('/admin/settings');
		const form = page.locator('form', { has: page.getByRole('heading', { name: 'Simulations' }) });
		const field = form.getByLabel('Time limit per run (s)');
		await expect(field).toHaveValue('10');
		await field.fill('2 min');
		await form.getByRole('button', { name: 'Save' }).click();
		await expect(form.getByText('Time limit per run (s): “2 min” is not a number.')).toBeVisible();
		await expect(field).toHaveValue('2 min');
		await expect(field).toHaveAttribute('aria-invalid', 'true');
		await field.fill('700');
		await form.getByRole('button', { name: 'Save' }).click();
		await expect(
			form.getByText('Time limit per run (s) must be from 0.1 to 600 seconds (got 700).')
		).toBeVisible();
		try {
			await field.fill('12.5');
			await form.getByRole('button', { name: 'Save' }).click();
			await expect(
				form.getByText(
					'Saved. A simulation, fit or study evaluation running longer than 12.5 s is now stopped.'
				)
			).toBeVisible();
			await page.reload();
			await expect(field).toHaveValue('12.5');
		} finally {
			await field.fill('10');
			await form.getByRole('button', { name: 'Save' }).click();
			await expect(form.getByText('longer than 10 s is now stopped')).toBeVisible();
		}
	});
});

test.describe('an engineer', () => {
	test.use({ role: 'engineer' });

	test('is refused the settings page and its time limit form', async ({ page }) => {
		expect((await page.goto('/admin/settings'))?.status()).toBe(403);
		const post = await page.request.post('/admin/settings?/simulationLimit', {
			form: { simulationTimeLimitS: '0.1' },
			headers: { origin: new URL(page.url()).origin }
		});
		expect(post.status()).toBe(403);
	});
});
