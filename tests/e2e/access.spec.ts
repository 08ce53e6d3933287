import { expect, test, type DemoRole } from './fixtures';

const REFUSED: Record<Exclude<DemoRole, 'admin'>, string> = {
	media_scientist: '/admin/people',
	prep_technician: '/admin/audit',
	engineer: '/admin/outbox',
	inventory_lead: '/admin/people/invite'
};

for (const [role, path] of Object.entries(REFUSED) as [DemoRole, string][]) {
	test.describe(`${role}`, () => {
		test.use({ role });
		test(`is refused ${path} with a 403 page that says why`, async ({ page }) => {
			const response = await page.goto(path);
			expect(response?.status()).toBe(403);
			await expect(
				page.getByRole('heading', { name: 'This page is not open to you' })
			).toBeVisible();
			await expect(page.getByTestId('error-message')).toContainText(
				'This needs the role Administrator'
			);
		});
	});
}

const REFUSED_SIMULATION: DemoRole[] = ['admin', 'prep_technician', 'inventory_lead'];

for (const role of REFUSED_SIMULATION) {
	test.describe(`${role} and the simulation pages`, () => {
		test.use({ role });
		for (const path of ['/simulation', '/simulation/continuous', '/simulation/fit']) {
			test(`is refused ${path} with a 403 page that says why`, async ({ page }) => {
				const response = await page.goto(path);
				expect(response?.status()).toBe(403);
				await expect(
					page.getByRole('heading', { name: 'This page is not open to you' })
				).toBeVisible();
				await expect(page.getByTestId('error-message')).toContainText(
					'This needs the role Process engineer or Media scientist'
				);
			});
		}
		test('is refused the saved scenarios endpoint with a 403 problem', async ({ page }) => {
			const response = await page.request.get('/api/v1/scenarios');
			expect(response.status()).toBe(403);
			expect(response.headers()['content-type']).toContain('application/problem+json');
		});
	});
}

test.describe('media_scientist and the simulation page', () => {
	test.use({ role: 'media_scientist' });
	test('may open it', async ({ page }) => {
		const response = await page.goto('/simulation');
		expect(response?.status()).toBe(200);
		await expect(page.getByRole('heading', { name: 'Process simulation' })).toBeVisible();
	});
});

test.describe('signed out', () => {
	test('a page sends you to sign in and back, without a loop', async ({ page }) => {
		await page.goto('/admin/people');
		await expect(page).toHaveURL(/\/login\?next=%2Fadmin%2Fpeople$/);
		await page.getByLabel('E-mail').fill('admin@demo.test');
		await page.getByLabel('Password').fill('brothwright-demo');
		await page.getByRole('button', { name: 'Sign in' }).click();
		await expect(page.getByRole('heading', { name: 'People' })).toBeVisible();
	});

	test('an endpoint answers 401 as problem+json', async ({ request }) => {
		const response = await request.get('/api/v1/me');
		expect(response.status()).toBe(401);
		expect(response.headers()['content-type']).toContain('application/problem+json');
		expect(await response.json()).toMatchObject({ status: 401, title: 'Unauthorized' });
	});

	test('an unknown endpoint answers 404 as problem+json', async ({ request }) => {
		const response = await request.get('/api/v1/no-such-thing');
		expect(response.status()).toBe(404);
		expect(response.headers()['content-type']).toContain('application/problem+json');
	});

	test('a malformed session request answers 400 with field paths', async ({ request }) => {
		const response = await request.post('/api/v1/session', { data: { email: 'not-an-email' } });
		expect(response.status()).toBe(400);
		const body = await response.json();
		expect(body.errors.map((e: { path: string }) => e.path).sort()).toEqual(['email', 'password']);
	});

	test('health needs no sign-in and reports the database', async ({ request }) => {
		const response = await request.get('/api/v1/health');
		expect(await response.json()).toMatchObject({ status: 'ok', database: 'ok' });
	});
});

test.describe('signed in through the API', () => {
	test.use({ role: 'engineer' });
	test('me reports e-mail and roles', async ({ page }) => {
		const response = await page.request.get('/api/v1/me');
		expect(await response.json()).toMatchObject({
			email: 'engineer@demo.test',
			roles: ['engineer']
		});
	});
});
