import { DEMO_PASSWORD, DEMO_STORES_LEAD, expect, pageAs, test } from './fixtures';

const PDF = Buffer.from('%PDF-1.4\n%test certificate\n1 0 obj<<>>endobj\ntrailer<<>>\n%%EOF\n');

function isoIn(days: number): string {
	const d = new Date();
	d.setUTCDate(d.getUTCDate() + days);
	return d.toISOString().slice(0, 10);
}

test.describe('inventory lead', () => {
	test.use({ role: 'inventory_lead' });

	test('receives a lot with a certificate, releases it, and a technician is offered it at batch preparation; a quarantined lot is not', async ({
		page,
		browser,
		baseURL
	}) => {
		const supplierLot = `E2E-${Date.now()}`;
		await page.goto('/lots/receive');
		await page.getByLabel('Component').selectOption('ammonium-sulfate');
		await page.getByLabel('Supplier', { exact: true }).fill('Calder Lab Supply');
		await page.getByLabel('Supplier lot').fill(supplierLot);
		await page.getByLabel('Quantity received').fill('3');
		await page.getByLabel('Unit').selectOption('kg');
		await page.getByLabel('Expiry or retest date').fill(isoIn(15));
		await page.getByLabel('Assay (%)').fill('99.5');
		await page
			.getByLabel(/^Certificates/)
			.setInputFiles({ name: 'coa-e2e.pdf', mimeType: 'application/pdf', buffer: PDF });
		await page.getByRole('button', { name: 'Receive into quarantine' }).click();
		await expect(page.getByRole('heading', { name: /^Lot L-\d{4}-\d{4}$/ })).toBeVisible();
		const code = (await page.getByRole('heading', { name: /^Lot / }).textContent())!
			.replace('Lot ', '')
			.trim();
		await expect(page.getByText('Quarantine', { exact: true })).toBeVisible();
		await expect(page.getByRole('link', { name: 'coa-e2e.pdf' })).toBeVisible();
		await expect(page.getByTestId('on-hand')).toHaveText('3 kg');
		const download = await page.request.get(
			(await page.getByRole('link', { name: 'coa-e2e.pdf' }).getAttribute('href'))!
		);
		expect(download.headers()['content-type']).toBe('application/pdf');
		expect(
			Buffer.from(await download.body())
				.subarray(0, 5)
				.toString()
		).toBe('%PDF-');

		await expect(page.getByTestId('signing-refusal')).toHaveText(
			'You received this lot, so someone else must release it.'
		);
		const checker = await pageAs(browser, { email: DEMO_STORES_LEAD }, baseURL!);
		await checker.goto(page.url());
		await checker.getByLabel('Your password (to sign)').fill(DEMO_PASSWORD);
		await checker.getByRole('button', { name: 'Release lot' }).click();
		await expect(
			checker.getByText('Released and signed: the lot can now be used in batches.')
		).toBeVisible();
		await checker.context().close();

		const quarantined = await (
			await page.request.get(
				'/api/v1/lots?status=quarantine&component=magnesium-sulfate-heptahydrate'
			)
		).json();
		const heldCode: string = quarantined.items[0].code;

		const technician = await pageAs(browser, 'prep_technician', baseURL!);
		await technician.goto('/batches/new');
		await technician
			.getByLabel('Recipe (approved version)')
			.selectOption({ label: 'NB-Min Salts 3 · version 1' });
		await technician.getByLabel('Target volume (L)').fill('1');
		await technician.getByLabel('Intended use (vessel or run)').fill('Shake flasks, e2e');
		await technician.getByRole('button', { name: 'Plan the batch' }).click();
		await expect(technician.getByRole('heading', { name: /^Batch MB-\d{4}-\d{4}$/ })).toBeVisible();
		const ammonium = technician.getByRole('article', { name: /Ammonium sulfate/ });
		await expect(ammonium.getByTestId('suggested-lot')).toHaveText(code);
		const magnesium = technician.getByRole('article', { name: /Magnesium sulfate heptahydrate/ });
		await expect(magnesium.getByTestId('suggested-lot')).not.toHaveText(heldCode);
		await magnesium.getByLabel(/Scan lot for line/).fill(heldCode);
		await magnesium.getByLabel(/Scan lot for line/).press('Enter');
		await expect(magnesium.getByRole('alert')).toHaveText(
			`Lot ${heldCode} is in quarantine, not released for use.`
		);
		await technician.context().close();
	});

	test('a certificate that is not a PDF or image is refused with the reason, and the form keeps what was typed', async ({
		page
	}) => {
		await page.goto('/lots/receive');
		await page.getByLabel('Component').selectOption('sodium-chloride');
		await page.getByLabel('Supplier', { exact: true }).fill('Northfield Reagents');
		await page.getByLabel('Supplier lot').fill('KEEP-ME-1');
		await page.getByLabel('Quantity received').fill('500');
		await page.getByLabel('Unit').selectOption('g');
		await page.getByLabel('Expiry or retest date').fill(isoIn(200));
		await page.getByLabel(/^Certificates/).setInputFiles({
			name: 'coa.pdf',
			mimeType: 'application/pdf',
			buffer: Buffer.from('<html>not a pdf</html>')
		});
		await page.getByRole('button', { name: 'Receive into quarantine' }).click();
		await expect(page.getByRole('alert').first()).toContainText(
			'“coa.pdf” is not a PDF, PNG or JPEG file (judged from its contents, not its name)'
		);
		await expect(page.getByLabel('Supplier lot')).toHaveValue('KEEP-ME-1');
		await expect(page.getByLabel('Quantity received')).toHaveValue('500');
		const lots = await (await page.request.get('/api/v1/lots?q=KEEP-ME-1')).json();
		expect(lots.total).toBe(0);
	});

	test('a volume for a powder with no density and an expiry before receipt are refused at their fields', async ({
		page
	}) => {
		await page.goto('/lots/receive');
		await page.getByLabel('Component').selectOption('ammonium-sulfate');
		await page.getByLabel('Supplier', { exact: true }).fill('Calder Lab Supply');
		await page.getByLabel('Supplier lot').fill('VOL-1');
		await page.getByLabel('Quantity received').fill('500');
		await page.getByLabel('Unit').selectOption('mL');
		await page.getByLabel('Expiry or retest date').fill(isoIn(-30));
		await page.getByRole('button', { name: 'Receive into quarantine' }).click();
		await expect(
			page.getByText(
				/Ammonium sulfate has no density in the component library, so it is kept by mass/
			)
		).toBeVisible();
		await expect(page.getByText(/must be after the date received/)).toBeVisible();
		await expect(page.getByLabel('Supplier lot')).toHaveValue('VOL-1');
	});

	test('the dashboard shows lots expiring soon and components below their reorder level', async ({
		page
	}) => {
		await page.goto('/inventory');
		await expect(page.getByRole('list', { name: 'expiring lots' })).toContainText('D-Glucose');
		await expect(page.getByRole('list', { name: 'components below reorder level' })).toContainText(
			'Magnesium sulfate heptahydrate'
		);
	});
});

test.describe('media scientist', () => {
	test.use({ role: 'media_scientist' });

	test('is refused releasing a lot', async ({ page, baseURL }) => {
		const quarantined = await (await page.request.get('/api/v1/lots?status=quarantine')).json();
		const lot = quarantined.items[0];
		await page.goto(`/lots/${lot.id}`);
		await expect(page.getByRole('heading', { name: `Lot ${lot.code}` })).toBeVisible();
		await expect(page.getByRole('button', { name: 'Release lot' })).toHaveCount(0);
		const response = await page.request.post(`/lots/${lot.id}?/sign`, {
			form: { decision: 'released', reason: '', password: 'brothwright-demo' },
			headers: { origin: baseURL! }
		});
		expect(response.status()).toBe(403);
		expect(await response.text()).toContain('This needs the role Inventory lead');
		const after = await (await page.request.get(`/api/v1/lots/${lot.id}`)).json();
		expect(after.lot.status).toBe('quarantine');
		const viaApi = await page.request.post('/api/v1/lots', {
			data: { component: 'sodium-chloride' }
		});
		expect(viaApi.status()).toBe(403);
	});
});
