import { readFile } from 'node:fs/promises';
import { inflateSync } from 'node:zlib';
import { PDFDocument } from 'pdf-lib';
import { pageAs, test, expect } from './fixtures';

/** The text pdf-lib drew: its content streams are deflated and its strings hex-encoded. */
function extractPdfText(bytes: Buffer): string {
	const raw = bytes.toString('latin1');
	const texts: string[] = [];
	for (const match of raw.matchAll(/stream\r?\n/g)) {
		const start = match.index + match[0].length;
		const end = raw.indexOf('endstream', start);
		let content: string;
		try {
			content = inflateSync(bytes.subarray(start, end)).toString('latin1');
		} catch {
			content = raw.slice(start, end);
		}
		for (const hex of content.matchAll(/<([0-9A-Fa-f]*)>\s*Tj/g)) texts.push(Buffer.from(hex[1], 'hex').toString('latin1'));
	}
	return texts.join(' ');
}

test.describe('an engineer runs a study', () => {
	test.use({ role: 'engineer' });

	test('sees the verdict, lowers kLa and sees it change, then prints the report', async ({ page }) => {
		await page.goto('/studies');
		await page.getByRole('link', { name: 'Yeast glycerol fed-batch, bench (demo)' }).click();
		await expect(page.getByTestId('verdict-text')).toHaveText('Supported');
		await expect(page.getByTestId('nutrient-table')).toContainText('Glycerol');
		await expect(page.getByTestId('limit')).toContainText('N');

		const kLa = page.getByLabel('kLa, 1/h', { exact: true });
		await kLa.fill('60');
		await expect(page.getByTestId('verdict-text')).toHaveText('Not supported');
		await expect(page.getByTestId('reasons')).toContainText('exceeds the maximum OTR');
		await expect(page.getByText('Showing the what-if.')).toBeVisible();

		await page.getByRole('button', { name: 'Back to the saved study' }).click();
		await expect(page.getByTestId('verdict-text')).toHaveText('Supported');

		await page.getByRole('link', { name: 'Print view' }).click();
		const report = page.getByTestId('study-report');
		await expect(report.getByTestId('verdict-text')).toHaveText('Supported');
		await expect(report.getByTestId('cautions')).toContainText('Oxygen-enriched gas raises the risk of fire');
		await expect(report.getByTestId('cautions')).toContainText("pressure rating");
		await expect(report.getByTestId('cautions')).toContainText('estimates');
		await expect(report.getByTestId('cautions')).toContainText('qualified engineers decide');
		await expect(report.getByTestId('defaults')).toContainText('Birou');
		await page.emulateMedia({ media: 'print' });
		await expect(page.getByRole('button', { name: 'Print' })).toBeHidden();
		const pdf = await page.pdf({ format: 'A4' });
		expect(pdf.byteLength).toBeGreaterThan(10_000);
	});

	test('downloads the report as a PDF with the verdict and the cautions', async ({ page }) => {
		await page.goto('/studies');
		await page.getByRole('link', { name: 'Yeast glycerol fed-batch, bench (demo)' }).click();
		await expect(page.getByTestId('verdict-text')).toHaveText('Supported');
		const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('link', { name: 'Download PDF' }).click()]);
		expect(download.suggestedFilename()).toBe('Yeast glycerol fed-batch, bench (demo).pdf');
		const bytes = await readFile(await download.path());
		expect(bytes.subarray(0, 5).toString()).toBe('%PDF-');
		expect(bytes.byteLength).toBeGreaterThan(2_000);

		const doc = await PDFDocument.load(bytes);
		expect(doc.getPageCount()).toBeGreaterThanOrEqual(1);
		expect(doc.getTitle()).toBe('Sufficiency study: Yeast glycerol fed-batch, bench (demo)');
		const text = extractPdfText(bytes);
		expect(text).toContain('Verdict: Supported');
		expect(text).toContain('Oxygen-enriched gas raises the risk of fire');
		expect(text).toContain('Glycerol');

		await page.getByRole('link', { name: 'Print view' }).click();
		await expect(page.getByRole('link', { name: 'Download PDF' })).toBeVisible();
		await page.emulateMedia({ media: 'print' });
		await expect(page.getByRole('link', { name: 'Download PDF' })).toBeHidden();

		const missing = await page.request.get('/studies/no-such-study/report.pdf');
		expect(missing.status()).toBe(404);
	});

	test('creates a study and is told plainly about a target beyond physical sense', async ({ page }) => {
		await page.goto('/studies/new');
		await page.getByLabel('Name').fill('E2E yeast check');
		await page.getByLabel('Basal medium (recipe version)').selectOption({ label: 'PPN Yeast-Glycerol A v1 (in review)' });
		await page.getByLabel('Organism profile').selectOption({ label: 'Demo yeast PPN-Y2' });
		await page.getByLabel('Vessel').selectOption({ index: 1 });
		await page.getByLabel('Target density').fill('900');
		await page.getByLabel('Initial volume, L').fill('6');
		await page.getByLabel('Inoculum density (same unit as the target)').fill('0.05');
		await page.getByLabel('Run duration, h').fill('40');
		await page.getByLabel('Feed start, h').fill('0');
		await page.getByRole('button', { name: 'Save and evaluate' }).click();
		await expect(page.locator('#field-targetValue-error')).toContainText('beyond physical sense');
		await expect(page.getByLabel('Name')).toHaveValue('E2E yeast check');

		await page.getByLabel('Target density').fill('8');
		await page.getByRole('button', { name: 'Save and evaluate' }).click();
		await expect(page.getByRole('heading', { name: 'E2E yeast check' })).toBeVisible();
		await expect(page.getByTestId('verdict-text')).toBeVisible();
	});

	test('the feed designer explains what it cannot do', async ({ page }) => {
		await page.goto('/studies');
		await page.getByRole('link', { name: 'Yeast glycerol fed-batch, bench (demo)' }).click();
		await page.getByLabel('Feed volume, L').last().fill('0.05');
		await page.getByRole('button', { name: 'Propose a feed' }).click();
		await expect(page.getByTestId('feed-design-problems')).toContainText('above its solubility');
		await expect(page.getByTestId('feed-design-problems')).toContainText('Ammonium sulfate');
	});
});

test.describe('a prep technician', () => {
	test.use({ role: 'prep_technician' });

	test('is refused creating a study', async ({ page }) => {
		const response = await page.goto('/studies/new');
		expect(response?.status()).toBe(403);
		const post = await page.request.post('/api/v1/studies/evaluate', { data: { studyId: 'x' } });
		expect(post.status()).toBe(403);
	});

	test('is refused the report PDF of a real study', async ({ page, browser, baseURL }) => {
		const engineer = await pageAs(browser, 'engineer', baseURL!);
		await engineer.goto('/studies');
		await engineer.getByRole('link', { name: 'Yeast glycerol fed-batch, bench (demo)' }).click();
		await expect(engineer.getByRole('link', { name: 'Download PDF' })).toBeVisible();
		const href = await engineer.getByRole('link', { name: 'Download PDF' }).getAttribute('href');
		await engineer.context().close();
		expect(href).toMatch(/^\/studies\/[^/]+\/report\.pdf$/);
		const response = await page.request.get(href!);
		expect(response.status()).toBe(403);
	});
});
