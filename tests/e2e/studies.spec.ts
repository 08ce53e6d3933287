import { readFile } from 'node:fs/promises';
import { PDFDocument } from 'pdf-lib';
import { pageAs, test, expect } from './fixtures';
import { pdfPageTexts } from './pdf-pages';

test.describe('an engineer runs a study', () => {
	test.use({ role: 'engineer' });

	test('sees the verdict, lowers kLa and sees it change, then prints the report', async ({
		page
	}) => {
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
		await expect(report.getByTestId('cautions')).toContainText(
			'Oxygen-enriched gas raises the risk of fire'
		);
		await expect(report.getByTestId('cautions')).toContainText('pressure rating');
		await expect(report.getByTestId('cautions')).toContainText('estimates');
		await expect(report.getByTestId('cautions')).toContainText('qualified engineers decide');
		await expect(report.getByTestId('defaults')).toContainText('Birou');
		await page.emulateMedia({ media: 'print' });
		await expect(page.getByRole('button', { name: 'Print' })).toBeHidden();
		const pdf = await page.pdf({ format: 'A4' });
		expect(pdf.byteLength).toBeGreaterThan(10_000);
	});

	test('follows the oxygen advice with one click, and the oxygen check then passes', async ({
		page
	}) => {
		await page.goto('/studies');
		await page.getByRole('link', { name: 'Yeast glycerol fed-batch, bench (demo)' }).click();
		await expect(page.getByTestId('verdict-text')).toHaveText('Supported');
		await page.getByLabel('kLa, 1/h', { exact: true }).fill('60');
		const oxygen = page.getByTestId('oxygen');
		await expect(oxygen.getByText('Short', { exact: true })).toBeVisible();
		const advice = oxygen.getByRole('button', { name: /^Try kLa / });
		const advised = (await advice.textContent())!.match(/Try kLa ([\d.]+)/)![1];
		await advice.click();
		await expect(page.getByLabel('kLa, 1/h', { exact: true })).toHaveValue(advised);
		await expect(oxygen.getByText('OK', { exact: true })).toBeVisible();
		await expect(page.getByTestId('verdict-text')).toHaveText('Supported');

		// The same with the O2 fraction: this bench vessel allows enrichment.
		await page.getByLabel('kLa, 1/h', { exact: true }).fill('150');
		await expect(oxygen.getByText('Short', { exact: true })).toBeVisible();
		await oxygen.getByRole('button', { name: /^Try O2 fraction / }).click();
		await expect(oxygen.getByText('OK', { exact: true })).toBeVisible();
		await expect(page.getByText('Oxygen-enriched gas raises the risk of fire.')).toBeVisible();
	});

	test('downloads the report as a PDF with the verdict and the cautions', async ({
		page
	}, testInfo) => {
		await page.goto('/studies');
		await page.getByRole('link', { name: 'Yeast glycerol fed-batch, bench (demo)' }).click();
		await expect(page.getByTestId('verdict-text')).toHaveText('Supported');
		const [download] = await Promise.all([
			page.waitForEvent('download'),
			page.getByRole('link', { name: 'Download PDF' }).click()
		]);
		expect(download.suggestedFilename()).toBe('Yeast glycerol fed-batch, bench (demo).pdf');
		const path = testInfo.outputPath('report.pdf');
		await download.saveAs(path);
		const bytes = await readFile(path);
		expect(bytes.subarray(0, 5).toString()).toBe('%PDF-');
		expect(bytes.byteLength).toBeGreaterThan(2_000);

		const doc = await PDFDocument.load(bytes);
		expect(doc.getTitle()).toBe('Sufficiency study: Yeast glycerol fed-batch, bench (demo)');
		const pages = pdfPageTexts(path);
		expect(pages.length).toBe(doc.getPageCount());
		const text = pages.join('\n');
		expect(text).toContain('Verdict: Supported');
		// This study sparges 50 % O2: the enriched-gas caution applies.
		expect(text).toContain('Oxygen-enriched gas raises the risk of fire');
		expect(text).toContain('Glycerol');
		expect(text).toContain('Biomass and substrate, g/L');
		pages.forEach((pageText, i) => expect(pageText).toContain(`Page ${i + 1} of ${pages.length}`));

		await page.getByRole('link', { name: 'Print view' }).click();
		await expect(page.getByRole('link', { name: 'Download PDF' })).toBeVisible();
		await page.emulateMedia({ media: 'print' });
		await expect(page.getByRole('link', { name: 'Download PDF' })).toBeHidden();

		const missing = await page.request.get('/studies/no-such-study/report.pdf');
		expect(missing.status()).toBe(404);
	});

	test('builds a study whose two feeds follow their own plans', async ({ page }) => {
		await page.goto('/studies/new');
		await page.getByLabel('Name').fill('E2E two feeds');
		await page
			.getByLabel('Basal medium (recipe version)')
			.selectOption({ label: 'NB-Min Salts 3 v1 (approved)' });
		await page.getByLabel('Organism profile').selectOption({ label: 'Demo bacterium PPN-B1' });
		await page
			.getByLabel('Vessel')
			.selectOption({ label: 'Bench stirred tank BST-10 (≤ 10 L, ≤ 150 kPa)' });
		await page.getByLabel('Target density').fill('20');
		await page.getByLabel('Initial volume, L').fill('5');
		await page.getByLabel('Inoculum density (same unit as the target)').fill('0.05');
		await page.getByLabel('Run duration, h').fill('24');

		const first = page.getByTestId('feed-slot-1');
		await first
			.getByLabel('Feed 1 (recipe version)')
			.selectOption({ label: 'PPN Glucose Feed B1 v1 (approved)' });
		await expect(first.getByLabel('Pump top rate, L/h')).toHaveCount(0);
		await first.getByLabel('Feed 1 plan').selectOption('doStat');
		await expect(first.getByLabel('Feed 1 volume available, L')).toBeVisible();
		await first.getByLabel('Feed 1 volume available, L').fill('1.5');
		await first.getByLabel('Feed 1 starts at, h').fill('8');
		await first.getByLabel('Feeds while DO is above, % of air saturation').fill('40');
		await page.getByRole('button', { name: 'Save and evaluate' }).click();
		// The pump rate was left out: the message names it and nothing typed is lost.
		await expect(page.locator('#field-feed1MaxRateLPerH-error')).toContainText("pump's top rate");
		await expect(page.getByLabel('Name')).toHaveValue('E2E two feeds');
		await expect(first.getByLabel('Feeds while DO is above, % of air saturation')).toHaveValue(
			'40'
		);
		await first.getByLabel('Pump top rate, L/h').fill('0.15');

		const second = page.getByTestId('feed-slot-2');
		await second
			.getByLabel('Feed 2 (recipe version)')
			.selectOption({ label: 'PPN Nitrogen Top-up N2 v1 (approved)' });
		await second.getByLabel('Feed 2 plan').selectOption('constant');
		await second.getByLabel('Feed 2 volume over the run, L').fill('0.4');
		await second.getByLabel('Feed 2 starts at, h').fill('8');
		await page.getByLabel('O2 mole fraction of the inlet gas').fill('0.4');
		await page.getByRole('button', { name: 'Save and evaluate' }).click();

		await expect(page.getByRole('heading', { name: 'E2E two feeds' })).toBeVisible();
		const feeds = page.getByTestId('feeds');
		await expect(feeds.getByTestId('feed-row')).toHaveCount(2);
		await expect(feeds.getByTestId('feed-row').first()).toContainText('DO-stat');
		await expect(feeds.getByTestId('feed-row').last()).toContainText('0.4 L planned');
		await expect(page.getByTestId('nutrient-table').getByTestId('runs-out').first()).toBeVisible();
	});

	test('creates a study and is told plainly about a target beyond physical sense', async ({
		page
	}) => {
		await page.goto('/studies/new');
		await page.getByLabel('Name').fill('E2E yeast check');
		await page
			.getByLabel('Basal medium (recipe version)')
			.selectOption({ label: 'PPN Yeast-Glycerol A v1 (in review)' });
		await page.getByLabel('Organism profile').selectOption({ label: 'Demo yeast PPN-Y2' });
		await page.getByLabel('Vessel').selectOption({ index: 1 });
		await page.getByLabel('Target density').fill('900');
		await page.getByLabel('Initial volume, L').fill('6');
		await page.getByLabel('Inoculum density (same unit as the target)').fill('0.05');
		await page.getByLabel('Run duration, h').fill('40');
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
		await page.getByLabel('Feed volume in all, L').fill('0.05');
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

test.describe('organism profiles', () => {
	test.use({ role: 'media_scientist' });

	test('show each yield a study uses and where it came from', async ({ page }) => {
		await page.goto('/organisms');
		await page.getByRole('link', { name: 'Demo bacterium PPN-B1' }).click();
		await expect(page.getByTestId('profile-yields')).toContainText('from RQ 1.05');
		await expect(page.getByLabel('Yx/s obtained by')).toHaveValue('respiratoryQuotient');
		await expect(page.getByTestId('computed-yield')).toContainText('worked out on the last save');

		await page.goto('/organisms');
		await page.getByRole('link', { name: 'Demo mammalian line PPN-M3' }).click();
		await expect(page.getByTestId('profile-yields')).toContainText(/Yx\/s on L-Glutamine/i);
		await page
			.getByLabel('Yields on further substrates')
			.fill('l-glutamine 0.684\npotassium-chloride from N');
		await page.getByRole('button', { name: 'Save profile' }).click();
		await expect(page.locator('#field-substrateYields-help')).toContainText('contains no N');
		await expect(page.getByLabel('Yields on further substrates')).toHaveValue(
			'l-glutamine 0.684\npotassium-chloride from N'
		);
	});

	test('show each element with its role and how sure its value is', async ({ page }) => {
		await page.goto('/organisms');
		await page.getByRole('link', { name: 'Demo bacterium PPN-B1' }).click();
		const elements = page.getByTestId('profile-elements');
		// Fe: trace by default (common practice), from memory in Neidhardt et al. (1990) as our table grades it.
		await expect(elements.getByTestId('profile-element-Fe')).toContainText('trace');
		await expect(elements.getByTestId('profile-element-Fe')).toContainText('from memory');
		// N: derived from the demo's formula CH1.8O0.5N0.2 with 8 % ash; it agrees with it, so no warning.
		await expect(elements.getByTestId('profile-element-N')).toContainText(
			'derived from published values'
		);
		await expect(page.getByTestId('formula-warnings')).toHaveCount(0);
		// The edit form holds the same, one row per element.
		await expect(page.getByLabel('How sure the value of Fe is')).toHaveValue('from memory');
		await expect(page.getByLabel('Role of Fe')).toHaveValue('');
	});

	test('sets the role and confidence of an element from the keyboard, is told what is missing by label, loses nothing', async ({
		page
	}) => {
		const name = `E2E elements ${Date.now()}`;
		await page.goto('/organisms/new');
		await page.getByLabel('Name', { exact: true }).fill(name);
		await page.getByLabel('Biomass formula (per C-mol, ash-free)').fill('CH1.8O0.5N0.2');
		await page.getByLabel('Ash fraction, g/g').fill('0.08');
		const fractions = page.getByLabel('Elemental mass fractions, g per g dry biomass');
		await fractions.fill('C 0.5\nH 0.08\nO 0.2\nN 0.14\nZn 0.0001\nFe 0.002');
		// A row per element typed, keyboard usable: each control has its own label.
		await expect(page.getByTestId('element-row-Fe')).toBeVisible();
		await page.getByLabel('Role of Fe').selectOption('required');
		await page.getByLabel('How sure the value of Fe is').selectOption('confirmed');
		await page.getByLabel('Role of Zn').selectOption('required');
		// Taking Zn out hides its row; typing it back brings back what was chosen for it.
		await fractions.fill('C 0.5\nH 0.08\nO 0.2\nN 0.14\nFe 0.002');
		await expect(page.getByTestId('element-row-Zn')).toBeHidden();
		await fractions.fill('C 0.5\nH 0.08\nO 0.2\nN 0.14\nFe 0.002\nZn 0.0001');
		await expect(page.getByLabel('Role of Zn')).toHaveValue('required');
		await page.getByRole('button', { name: 'Create profile' }).click();

		// A published value needs its source: the message names the field by its label, and everything typed stays.
		await expect(page.locator('#element-Fe-source-error')).toHaveText(
			'Source of Fe: a published or derived value needs its source (the table or paper it comes from).'
		);
		await expect(page.getByLabel('Source of Fe')).toHaveAttribute('aria-invalid', 'true');
		await expect(page.getByLabel('Name', { exact: true })).toHaveValue(name);
		await expect(fractions).toHaveValue('C 0.5\nH 0.08\nO 0.2\nN 0.14\nFe 0.002\nZn 0.0001');
		await expect(page.getByLabel('Role of Fe')).toHaveValue('required');
		await expect(page.getByLabel('How sure the value of Fe is')).toHaveValue('confirmed');
		await expect(page.getByLabel('Role of Zn')).toHaveValue('required');

		// From the confidence to the source with Tab, typed from the keyboard.
		await page.getByLabel('How sure the value of Fe is').focus();
		await page.keyboard.press('Tab');
		await expect(page.getByLabel('Source of Fe')).toBeFocused();
		await page.keyboard.type('Published iron content of the strain (test value)');
		await page.getByRole('button', { name: 'Create profile' }).click();

		await expect(page.getByRole('heading', { name })).toBeVisible();
		const fe = page.getByTestId('profile-element-Fe');
		await expect(fe.getByTestId('profile-element-role')).toHaveText(
			'required, set by this profile'
		);
		await expect(fe).toContainText('published');
		await expect(fe).toContainText('Published iron content of the strain (test value)');
		// Neidhardt-type fractions against CH1.8O0.5N0.2 with 8 % ash: N 0.2 × 14.007 / 24.626 × 0.92 = 10.5 %
		// (24.626 g/C-mol, chemistry/REFERENCES.md, derived).
		await expect(page.getByTestId('formula-warnings')).toContainText(
			'N is 14 % in the fractions but 10.5 % by the formula CH1.8O0.5N0.2 with 8 % ash'
		);
	});
});

test.describe('a study report marks each nutrient line', () => {
	test.use({ role: 'engineer' });

	test('with its role and confidence, and names short trace elements among the warnings, not the reasons', async ({
		page
	}) => {
		await page.goto('/studies');
		await page.getByRole('link', { name: 'Bacterium glucose fed-batch, pilot (demo)' }).click();
		await expect(page.getByTestId('limit')).toContainText('N');
		const fe = page
			.getByTestId('nutrient-row')
			.filter({ has: page.getByText('Fe', { exact: true }) });
		await expect(fe.getByTestId('nutrient-role')).toHaveText('trace');
		await expect(fe.getByTestId('nutrient-confidence')).toContainText('from memory');
		await expect(fe).toContainText('Short: trace, a warning');
		await expect(page.getByTestId('warnings')).toContainText('Ca is in no source');
		await expect(page.getByTestId('reasons')).not.toContainText('Fe');
		await expect(page.getByTestId('reasons')).toContainText('N runs short');

		await page.getByRole('link', { name: 'Print view' }).click();
		const report = page.getByTestId('study-report');
		await expect(report.getByTestId('nutrient-role').first()).toBeVisible();
		await expect(report.getByTestId('warnings')).toContainText('Fe covers');
	});
});
