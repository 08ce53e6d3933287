import { DEMO, expect, signInWithForm, test, type DemoRole } from './fixtures';

const ALL_ROLES = Object.keys(DEMO) as DemoRole[];

/** Who sees each navigation entry; everyone else must not see it. */
const VISIBLE_TO: Record<string, DemoRole[]> = {
	Overview: ALL_ROLES,
	Recipes: ALL_ROLES,
	Components: ALL_ROLES,
	Batches: ALL_ROLES,
	Lots: ALL_ROLES,
	'Scan a batch': ['prep_technician'],
	Inventory: ['inventory_lead'],
	'Process simulation': ['engineer', 'media_scientist'],
	Studies: ['engineer', 'media_scientist'],
	Organisms: ['engineer', 'media_scientist'],
	Vessels: ['engineer', 'media_scientist'],
	People: ['admin'],
	Outbox: ['admin'],
	'Audit trail': ['admin'],
	Settings: ['admin']
};

const OWN_NAVIGATION = Object.fromEntries(
	ALL_ROLES.map((role) => {
		const labels = Object.keys(VISIBLE_TO);
		return [
			role,
			{
				shows: labels.filter((l) => VISIBLE_TO[l].includes(role)),
				hides: labels.filter((l) => !VISIBLE_TO[l].includes(role))
			}
		];
	})
) as Record<DemoRole, { shows: string[]; hides: string[] }>;

for (const [role, email] of Object.entries(DEMO) as [DemoRole, string][]) {
	test(`${role} signs in with the form and sees only their own navigation`, async ({ page }) => {
		await signInWithForm(page, email);
		await expect(page.getByRole('heading', { name: 'Overview' })).toBeVisible();
		const nav = page.getByRole('navigation', { name: 'Main' });
		for (const label of OWN_NAVIGATION[role].shows) {
			await expect(nav.getByRole('link', { name: label, exact: true })).toBeVisible();
		}
		for (const label of OWN_NAVIGATION[role].hides) {
			await expect(nav.getByRole('link', { name: label, exact: true })).toHaveCount(0);
		}
		await expect(page.getByTestId('signed-in-as')).toBeVisible();
	});
}

test('a wrong password says so and keeps the e-mail filled in', async ({ page }) => {
	await signInWithForm(page, DEMO.engineer, 'not-the-password');
	await expect(page.getByRole('alert')).toContainText(
		'The e-mail address or the password is not right.'
	);
	await expect(page.getByLabel('E-mail')).toHaveValue(DEMO.engineer);
});

test('an unknown e-mail gets the same answer as a wrong password', async ({ page }) => {
	await signInWithForm(page, 'stranger@demo.test', 'whatever-it-is');
	await expect(page.getByRole('alert')).toContainText(
		'The e-mail address or the password is not right.'
	);
	await expect(page.getByLabel('E-mail')).toHaveValue('stranger@demo.test');
});

test('signing out ends the session', async ({ page }) => {
	await signInWithForm(page, DEMO.media_scientist);
	await expect(page.getByRole('heading', { name: 'Overview' })).toBeVisible();
	await page.getByRole('button', { name: 'Sign out' }).click();
	await expect(page).toHaveURL(/\/login$/);
	await page.goto('/');
	await expect(page).toHaveURL(/\/login\?next=%2F$/);
	const me = await page.request.get('/api/v1/me');
	expect(me.status()).toBe(401);
});

test('the session cookie is httpOnly and SameSite=Lax', async ({ page, context }) => {
	await signInWithForm(page, DEMO.engineer);
	await expect(page.getByRole('heading', { name: 'Overview' })).toBeVisible();
	const cookie = (await context.cookies()).find((c) => c.name === 'brothwright_session');
	expect(cookie?.httpOnly).toBe(true);
	expect(cookie?.sameSite).toBe('Lax');
	expect(cookie?.secure).toBe(false); // the test origin is plain http
});
