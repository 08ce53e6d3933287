import { expect, signInWithForm, test } from './fixtures';

test.describe('an invitation, end to end through the outbox', () => {
	test.use({ role: 'admin' });

	test('admin invites, the invitee follows the mailed link, sets a password and lands with their role', async ({
		page,
		browser
	}) => {
		// Two people, three sessions and a password set then changed: each password is hashed with
		// argon2id on purpose slowly, so this journey needs more than one page's time.
		test.slow();
		const email = `new-${Date.now()}@demo.test`;
		await page.goto('/admin/people/invite');
		await page.getByLabel('E-mail').fill(email);
		await page.getByLabel('Name (optional; they can change it)').fill('Invited Colleague');
		await page.getByLabel('Inventory lead').check();
		await page.getByRole('button', { name: 'Send the invitation' }).click();
		await expect(page.getByText(`Invitation sent to ${email}`)).toBeVisible();

		await page.goto('/admin/outbox');
		const row = page.getByRole('row').filter({ hasText: email });
		await row.getByRole('link', { name: 'Your invitation to Brothwright' }).click();
		const link = await page.getByTestId('mail-body').getByRole('link').getAttribute('href');
		expect(link).toMatch(/\/invite\/[A-Za-z0-9_-]+$/);

		const invitee = await browser.newContext();
		const inviteePage = await invitee.newPage();
		await inviteePage.goto(link!);
		await expect(inviteePage.getByText('You are invited as Inventory lead')).toBeVisible();
		await inviteePage.getByLabel('Password', { exact: true }).fill('short');
		await inviteePage.getByLabel('Password again').fill('short');
		await inviteePage.getByRole('button', { name: 'Create my account' }).click();
		await expect(inviteePage.getByText('Use at least 12 characters.')).toBeVisible();
		await expect(inviteePage.getByLabel('Your name')).toHaveValue('Invited Colleague');

		// Long enough but a keyboard walk: refused with zxcvbn's reason, and never sent back.
		await inviteePage.getByLabel('Password', { exact: true }).fill('qwertyuiopas');
		await inviteePage.getByLabel('Password again').fill('qwertyuiopas');
		await inviteePage.getByRole('button', { name: 'Create my account' }).click();
		await expect(inviteePage.getByRole('alert')).toContainText(/too easy to guess/);
		expect(await inviteePage.content()).not.toContain('qwertyuiopas');

		await inviteePage.getByLabel('Password', { exact: true }).fill('glycerol-feed-ramp');
		await inviteePage.getByLabel('Password again').fill('glycerol-feed-ramp');
		await inviteePage.getByRole('button', { name: 'Create my account' }).click();
		await expect(inviteePage.getByText('Your account is ready.')).toBeVisible();
		await expect(inviteePage.getByTestId('signed-in-as')).toHaveText('Invited Colleague');

		// Signed in elsewhere too; changing the password here signs that session out.
		const elsewhere = await browser.newContext();
		const elsewherePage = await elsewhere.newPage();
		await signInWithForm(elsewherePage, email, 'glycerol-feed-ramp');
		await expect(elsewherePage.getByTestId('signed-in-as')).toHaveText('Invited Colleague');

		await inviteePage.getByRole('link', { name: 'Change password' }).click();
		await inviteePage.getByLabel('Current password').fill('not-my-password');
		await inviteePage.getByLabel('New password', { exact: true }).fill('harbour-lantern-mosaic');
		await inviteePage.getByLabel('New password again').fill('harbour-lantern-mosaic');
		await inviteePage.getByRole('button', { name: 'Change the password' }).click();
		await expect(inviteePage.getByRole('alert')).toContainText(
			'The current password is not right.'
		);
		expect(await inviteePage.content()).not.toContain('harbour-lantern-mosaic');

		await inviteePage.getByLabel('Current password').fill('glycerol-feed-ramp');
		await inviteePage.getByLabel('New password', { exact: true }).fill('harbour-lantern-mosaic');
		await inviteePage.getByLabel('New password again').fill('harbour-lantern-mosaic');
		await inviteePage.getByRole('button', { name: 'Change the password' }).click();
		await expect(inviteePage.getByRole('status')).toContainText(
			'Your password is changed. 1 other session was signed out.'
		);
		await elsewherePage.reload();
		await expect(elsewherePage).toHaveURL(/\/login/);
		await elsewhere.close();

		// The link is spent.
		await inviteePage.goto(link!);
		await expect(inviteePage.getByText('This link has already been used')).toBeVisible();
		await invitee.close();

		await page.goto('/admin/people');
		await page.getByRole('searchbox', { name: 'Search people' }).fill(email);
		await expect(page.getByRole('row').filter({ hasText: email })).toContainText('Inventory lead');
	});

	test('people list sorts and filters', async ({ page }) => {
		await page.goto('/admin/people');
		await page.getByRole('searchbox', { name: 'Search people' }).fill('technician');
		await expect(page.getByRole('row')).toHaveCount(2);
		await page.getByRole('searchbox', { name: 'Search people' }).fill('');
		await page.getByRole('button', { name: 'E-mail' }).click();
		const firstCell = page.getByRole('row').nth(1).getByRole('cell').nth(1);
		await expect(firstCell).toHaveText('admin@demo.test');
		await page.getByRole('button', { name: 'E-mail' }).click();
		await expect(page.getByRole('row').nth(1).getByRole('cell').nth(1)).not.toHaveText(
			'admin@demo.test'
		);
	});
});
