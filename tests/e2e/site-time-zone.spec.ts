import { expect, test } from './fixtures';

// The site setting `site.time_zone` on the admin settings page, and a record read in it. Left at
// UTC: the other browser tests run meanwhile and read dates.
test.describe('an administrator sets the site time zone', () => {
	test.use({ role: 'admin' });

	test('a name that is not a zone is refused at the field, keeping what was typed; times read ISO, 24-hour, with the zone', async ({
		page
	}) => {
		await page.goto('/admin/settings');
		const form = page.locator('form', { has: page.getByRole('heading', { name: 'Time zone' }) });
		const field = form.getByLabel('Site time zone');
		await expect(field).toHaveValue('UTC');
		await field.fill('Mars/Olympus_Mons');
		await form.getByRole('button', { name: 'Save' }).click();
		await expect(
			form.getByText('Site time zone: “Mars/Olympus_Mons” is not a time zone name')
		).toBeVisible();
		await expect(field).toHaveValue('Mars/Olympus_Mons');
		await expect(field).toHaveAttribute('aria-invalid', 'true');
		await field.fill('UTC');
		await form.getByRole('button', { name: 'Save' }).click();
		await expect(form.getByText('Saved. Dates and times are now shown in UTC.')).toBeVisible();

		// A record's moments read as the site shows every one: 2026-12-03 14:05 UTC.
		const me = await (await page.request.get('/api/v1/me')).json();
		await page.goto(`/admin/people/${me.id}`);
		const first = page.locator('time').first();
		await expect(first).toHaveText(/^\d{4}-\d{2}-\d{2} \d{2}:\d{2} UTC$/);
		const iso = (await first.getAttribute('datetime'))!;
		expect(await first.textContent()).toBe(`${iso.slice(0, 10)} ${iso.slice(11, 16)} UTC`);
	});
});
