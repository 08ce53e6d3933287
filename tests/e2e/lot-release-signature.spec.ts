import { DEMO_PASSWORD, DEMO_STORES_LEAD, expect, test } from './fixtures';

/** The demo lot waiting in quarantine for this spec: received by the inventory lead. */
async function demoLot(page: import('@playwright/test').Page, supplierLot: string) {
	const found = await (await page.request.get(`/api/v1/lots?q=${supplierLot}`)).json();
	expect(found.total).toBe(1);
	return found.items[0] as { id: string; code: string; status: string };
}

test.describe('an inventory lead who did not receive the lot', () => {
	test.beforeEach(async ({ page }) => {
		const response = await page.request.post('/api/v1/session', {
			data: { email: DEMO_STORES_LEAD, password: DEMO_PASSWORD }
		});
		expect(response.status(), await response.text()).toBe(200);
	});

	test('releases a quarantined lot by signing with the password, and the signature is listed', async ({
		page
	}) => {
		const lot = await demoLot(page, 'CLS-KP-5127');
		expect(lot.status).toBe('quarantine');
		await page.goto(`/lots/${lot.id}`);
		await expect(page.getByRole('heading', { name: `Lot ${lot.code}` })).toBeVisible();
		const signatures = page.getByRole('region', { name: 'Signatures' });
		await expect(signatures).toContainText('No signatures yet.');

		await page.getByLabel('Reason (required to reject)').fill('Certificate checked against spec.');
		await page.getByLabel('Your password (to sign)').fill('not-the-password');
		await page.getByRole('button', { name: 'Release lot' }).click();
		await expect(page.locator('#field-password-error')).toHaveText(
			'The password is not right for your account; nothing was signed.'
		);
		await expect(page.getByLabel('Reason (required to reject)')).toHaveValue(
			'Certificate checked against spec.'
		);
		await expect(page.getByText('Quarantine', { exact: true })).toBeVisible();

		await page.getByLabel('Your password (to sign)').fill(DEMO_PASSWORD);
		await page.getByRole('button', { name: 'Release lot' }).click();
		await expect(
			page.getByText('Released and signed: the lot can now be used in batches.')
		).toBeVisible();
		const signature = signatures.getByTestId('signature');
		await expect(signature).toHaveCount(1);
		await expect(signature).toContainText('Demo Stores Lead');
		await expect(signature).toContainText('released for use');
		await expect(signature).toContainText('Certificate checked against spec.');
		await expect(signature).toContainText(/Signed content SHA-256 [0-9a-f]{64}/);
		const after = await (await page.request.get(`/api/v1/lots/${lot.id}`)).json();
		expect(after.lot.status).toBe('released');
	});
});

test.describe('the inventory lead who received the lot', () => {
	test.use({ role: 'inventory_lead' });

	test('is told why they may not release it, and a forced attempt is refused and recorded', async ({
		page,
		baseURL
	}) => {
		const lot = await demoLot(page, 'NR-25-0102');
		await page.goto(`/lots/${lot.id}`);
		await expect(page.getByTestId('signing-refusal')).toHaveText(
			'You received this lot, so someone else must release it.'
		);
		await expect(page.getByRole('button', { name: 'Release lot' })).toHaveCount(0);
		await expect(page.getByLabel('Your password (to sign)')).toHaveCount(0);

		const response = await page.request.post(`/lots/${lot.id}?/sign`, {
			form: { decision: 'released', reason: '', password: DEMO_PASSWORD },
			headers: { origin: baseURL!, 'x-sveltekit-action': 'true' }
		});
		expect(await response.text()).toContain(
			'You received this lot, so someone else must release it.'
		);
		await page.reload();
		await expect(page.getByText('Quarantine', { exact: true })).toBeVisible();
		await expect(page.getByRole('region', { name: 'Signatures' })).toContainText(
			'No signatures yet.'
		);
		await expect(page.getByText(/signature\.refused/).first()).toBeVisible();
	});
});
