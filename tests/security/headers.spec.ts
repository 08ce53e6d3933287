import { expect, test } from '../e2e/fixtures';

/** Headers every answer carries, signed in or not. */
function expectHardening(headers: Record<string, string>) {
	expect(headers['x-content-type-options']).toBe('nosniff');
	expect(headers['referrer-policy']).toBe('same-origin');
	expect(headers['permissions-policy']).toContain('microphone=()');
	expect(headers['permissions-policy']).toContain('geolocation=()');
	expect(headers['permissions-policy']).toContain('camera=(self)');
}

test('the sign-in page carries a strict CSP and hydrates under it', async ({ page }) => {
	const violations: string[] = [];
	page.on('console', (m) => {
		if (/Content[- ]Security[- ]Policy/i.test(m.text())) violations.push(m.text());
	});
	const response = await page.goto('/login');
	const headers = response!.headers();
	expectHardening(headers);
	const csp = headers['content-security-policy'];
	expect(csp).toMatch(/script-src 'self' 'nonce-[^']+'/);
	expect(csp).not.toMatch(/script-src[^;]*unsafe-inline/);
	expect(csp).toContain("frame-ancestors 'none'");
	expect(csp).toContain("object-src 'none'");
	await expect(page.locator('html[data-hydrated]')).toBeAttached();
	expect(violations).toEqual([]);
});

test.describe('signed in', () => {
	test.use({ role: 'inventory_lead' });

	test('pages and exports are not stored by caches', async ({ page }) => {
		const response = await page.goto('/lots');
		expectHardening(response!.headers());
		expect(response!.headers()['cache-control']).toBe('private, no-store');
		expect(response!.headers()['content-security-policy']).toBeTruthy();

		const csv = await page.request.get('/lots/export.csv');
		expect(csv.status()).toBe(200);
		expectHardening(csv.headers());
		expect(csv.headers()['cache-control']).toBe('private, no-store');
	});
});

test.describe('charts under the CSP', () => {
	test.use({ role: 'engineer' });

	test('the simulation page draws without a CSP violation', async ({ page }) => {
		const violations: string[] = [];
		page.on('console', (m) => {
			if (/Content[- ]Security[- ]Policy/i.test(m.text())) violations.push(m.text());
		});
		await page.goto('/simulation');
		await page.getByRole('button', { name: 'Run simulation' }).click();
		await expect(page.getByTestId('chart-concentrations').locator('canvas')).toBeVisible();
		expect(violations).toEqual([]);
	});
});
