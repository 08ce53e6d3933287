import { test as base, expect, type Browser, type Page } from '@playwright/test';

export const DEMO_PASSWORD = 'brothwright-demo';

export const DEMO = {
	admin: 'admin@demo.test',
	media_scientist: 'scientist@demo.test',
	prep_technician: 'technician@demo.test',
	engineer: 'engineer@demo.test',
	inventory_lead: 'inventory@demo.test'
} as const;

export type DemoRole = keyof typeof DEMO;

/** A second demo media scientist, for what one scientist changes and another reviews. */
export const SECOND_SCIENTIST = 'scientist2@demo.test';

/** A second inventory lead: signs for the lots the first one received. */
export const DEMO_STORES_LEAD = 'stores@demo.test';

/** Signs in through the form, as a person would. */
export async function signInWithForm(page: Page, email: string, password = DEMO_PASSWORD) {
	await page.goto('/login');
	await page.getByLabel('E-mail').fill(email);
	await page.getByLabel('Password').fill(password);
	await page.getByRole('button', { name: 'Sign in' }).click();
}

/**
 * `test.use({ role: 'engineer' })` gives a page already signed in as that demo account
 * (through the session endpoint, which sets the same cookie as the form). Every test also fails
 * on an uncaught error in the page: a broken render can otherwise pass as a slow one.
 */
export const test = base.extend<{ role: DemoRole | null }>({
	role: [null, { option: true }],
	page: async ({ page, role }, use) => {
		const pageErrors: string[] = [];
		page.on('pageerror', (error) => pageErrors.push(error.message));
		// Typing into the server-rendered page before its scripts take over can be lost, so every
		// page opened with goto is awaited until the app marks itself hydrated (root layout).
		const goto = page.goto.bind(page);
		page.goto = async (url, options) => {
			const response = await goto(url, options);
			if (response?.headers()['content-type']?.includes('text/html'))
				await page.locator('html[data-hydrated]').waitFor({ state: 'attached' });
			return response;
		};
		if (role) {
			const response = await page.request.post('/api/v1/session', {
				data: { email: DEMO[role], password: DEMO_PASSWORD }
			});
			expect(response.status(), await response.text()).toBe(200);
		}
		await use(page);
		expect(pageErrors, 'uncaught errors in the page').toEqual([]);
	}
});

/** A second signed-in page in its own browser context, for a test that needs two people. */
export async function pageAs(
	browser: Browser,
	role: DemoRole | { email: string },
	baseURL: string
): Promise<Page> {
	const context = await browser.newContext({ baseURL });
	const page = await context.newPage();
	const email = typeof role === 'string' ? DEMO[role] : role.email;
	const response = await page.request.post('/api/v1/session', {
		data: { email, password: DEMO_PASSWORD }
	});
	expect(response.status(), await response.text()).toBe(200);
	return page;
}

export { expect };
