import { copyFileSync, mkdirSync } from 'node:fs';
import type { Browser, Page } from '@playwright/test';
import { expect, pageAs, test } from './fixtures';
import {
	decodeQrIn,
	greyAt,
	pdfTextIn,
	PX_PER_MM,
	readLabelLayout,
	readPng,
	renderFirstPage,
	type Box,
	type LabelLayout
} from './label-print-helpers';
import { LOT_STATUS_LABELS, type LotStatus } from '../../src/lib/inventory';
import {
	LABEL_PAGE_MARGIN_MM,
	LABEL_SIZE_IDS,
	LABEL_SIZES,
	type LabelSize,
	type LabelSizeId
} from '../../src/lib/lot-labels';
import { lotQrText } from '../../src/lib/server/inventory/labels';

type ListedLot = {
	id: string;
	code: string;
	status: LotStatus;
	componentName: string;
	supplier: string;
	supplierLot: string;
	storage: string;
};

const DPI = 200;
const IMAGE_PX_PER_CSS_PX = DPI / 96;
const IMAGE_PX_PER_MM = DPI / 25.4;
/** The page's printable area inside its margins, in CSS px, so the print layout is the PDF's. */
const A4_CONTENT = {
	width: Math.round((210 - 2 * LABEL_PAGE_MARGIN_MM) * PX_PER_MM),
	height: Math.round((297 - 2 * LABEL_PAGE_MARGIN_MM) * PX_PER_MM)
};

/** Demo lots (by supplier lot): in quarantine, released, released with a retest date, rejected. */
const DEMO_SUPPLIER_LOTS = [
	'NR-25-0102',
	'NR-24-0931',
	'BWB-YE-118',
	'CLS-SP-3907',
	'KT-MN-2611',
	'KT-CO-2611'
];
/**
 * Cobalt(II) chloride hexahydrate as supplied (H302 H317 H334 H341 H350i H360F H410 in
 * chemistry/data/components.ts): exclamation mark, health hazard and environment (UN GHS Annex 1;
 * the exclamation mark stays beside the health hazard for the skin sensitiser, H317).
 */
const COBALT_PICTOGRAMS = ['Exclamation mark', 'Health hazard', 'Environment'];

async function findDemoLot(page: Page, supplierLot: string) {
	const found = await (await page.request.get(`/api/v1/lots?q=${supplierLot}`)).json();
	expect(found.total, supplierLot).toBe(1);
	return found.items[0] as ListedLot;
}

function isoIn(days: number): string {
	const d = new Date();
	d.setUTCDate(d.getUTCDate() + days);
	return d.toISOString().slice(0, 10);
}

/** A lot whose every text is as long as the lot form takes, storage with a source note at its end. */
async function receiveLongLot(browser: Browser, baseURL: string, tag: string): Promise<ListedLot> {
	const lead = await pageAs(browser, 'inventory_lead', baseURL);
	const storageStart = 'Keep below 25 °C, dry, tightly closed, away from strong oxidisers; ';
	const storage =
		`${storageStart}${'Unbrokenwordthatrunsonandon'.repeat(4)} ${'store apart '.repeat(10)}`
			.slice(0, 200 - ' (common practice)'.length)
			.concat(' (common practice)');
	const response = await lead.request.post('/api/v1/lots', {
		data: {
			component: 'l-glutamic-acid-monosodium-salt-monohydrate',
			supplier:
				`Very Long Supplier Name Fine Chemicals and Biological Reagents Trading ${tag}`.padEnd(
					120,
					'x'
				),
			supplierLot: `${tag}-${'W'.repeat(80)}`.slice(0, 80),
			quantity: '500',
			unit: 'g',
			receivedOn: isoIn(-1),
			expiresOn: isoIn(500),
			dateKind: 'retest',
			storage,
			assayPercent: '99.0'
		}
	});
	expect(response.status(), await response.text()).toBe(201);
	const lot = await response.json();
	await lead.context().close();
	expect(lot.storage).toBe(storage);
	return { ...lot, componentName: 'L-Glutamic acid monosodium salt monohydrate' };
}

/** What each label says on screen, before anything is printed. */
async function expectLabelTexts(page: Page, lots: ListedLot[], sizeId: LabelSizeId) {
	await expect(page.getByTestId('lot-label')).toHaveCount(lots.length);
	for (const lot of lots) {
		const label = page.getByRole('article', { name: `Label ${lot.code}` });
		await expect(label.getByTestId('label-code')).toHaveText(lot.code);
		await expect(label.getByTestId('label-status')).toHaveText(LOT_STATUS_LABELS[lot.status]);
		await expect(label).not.toContainText('common practice');
		const pictograms = label.getByTestId('label-hazards').getByRole('img');
		if (lot.supplierLot === 'KT-CO-2611' && sizeId !== 'small') {
			const names = await pictograms.evaluateAll((imgs) =>
				imgs.map((img) => img.getAttribute('aria-label'))
			);
			expect(names.sort()).toEqual([...COBALT_PICTOGRAMS].sort());
		} else if (sizeId === 'small') await expect(pictograms).toHaveCount(0);
		if (sizeId === 'small') {
			await expect(label.getByTestId('label-name')).toHaveCount(0);
			await expect(label.getByTestId('label-supplier')).toHaveCount(0);
			await expect(label.getByTestId('label-storage')).toHaveCount(0);
		} else {
			await expect(label.getByTestId('label-name')).toHaveText(lot.componentName);
			await expect(label.getByTestId('label-supplier')).toContainText(lot.supplierLot);
			await expect(label.getByTestId('label-storage')).toHaveText(
				lot.storage.replace(' (common practice)', '')
			);
		}
	}
	const retestLabel = page.getByRole('article', { name: `Label ${lots[2].code}` });
	await expect(retestLabel.getByTestId('label-date')).toHaveText(/^Retest \d{4}-\d{2}-\d{2}$/);
	const expiryLabel = page.getByRole('article', { name: `Label ${lots[1].code}` });
	await expect(expiryLabel.getByTestId('label-date')).toHaveText(/^Exp \d{4}-\d{2}-\d{2}$/);
}

function expectInsideOutlines(layout: LabelLayout[], size: LabelSize) {
	for (const label of layout) {
		expect(label.outline.width, label.code).toBeCloseTo(size.widthMm * PX_PER_MM, 0);
		expect(label.outline.height, label.code).toBeCloseTo(size.heightMm * PX_PER_MM, 0);
		expect(label.outside, `${label.code}: outside its outline`).toEqual([]);
		expect(label.spilling, `${label.code}: content spilling`).toEqual([]);
		expect(label.codeLines, `${label.code}: the code on one line`).toBe(1);
		expect(label.codeClipped, `${label.code}: the code shown whole`).toBe(false);
	}
}

/** A box on the sheet (CSS px) as pixels of the page image, grown by `padMm` on every side. */
function onPageImage(box: Box, padMm: number): Box {
	const marginPx = LABEL_PAGE_MARGIN_MM * IMAGE_PX_PER_MM;
	return {
		x: marginPx + box.x * IMAGE_PX_PER_CSS_PX - padMm * IMAGE_PX_PER_MM,
		y: marginPx + box.y * IMAGE_PX_PER_CSS_PX - padMm * IMAGE_PX_PER_MM,
		width: box.width * IMAGE_PX_PER_CSS_PX + 2 * padMm * IMAGE_PX_PER_MM,
		height: box.height * IMAGE_PX_PER_CSS_PX + 2 * padMm * IMAGE_PX_PER_MM
	};
}

/** Page 1 of the PDF: each outline where the layout put it, its QR read back, its words in it. */
function expectPrintedLabels(
	pdfPath: string,
	pngPath: string,
	layout: LabelLayout[],
	lots: ListedLot[]
) {
	const png = readPng(pngPath);
	// Page 1 only: a label that starts below its foot is printed on the next page.
	const onFirstPage = lots.filter((_, i) => {
		const { y, height } = layout[i].outline;
		return y + height <= A4_CONTENT.height;
	});
	expect(onFirstPage.length).toBeGreaterThanOrEqual(Math.min(lots.length, 6));
	for (const [i, lot] of onFirstPage.entries()) {
		const outline = onPageImage(layout[i].outline, 0);
		const borderPx = (layout[i].borderPx / 2) * IMAGE_PX_PER_CSS_PX;
		expect(greyAt(png, outline.x + borderPx, outline.y + outline.height / 2)).toBeLessThan(128);
		expect(greyAt(png, outline.x + outline.width / 2, outline.y + borderPx)).toBeLessThan(128);

		expect(decodeQrIn(png, onPageImage(layout[i].outline, 1)), lot.code).toBe(lotQrText(lot));

		const text = pdfTextIn(pdfPath, DPI, outline);
		expect(text, lot.code).toContain(lot.code);
		expect(text.toLowerCase(), lot.code).toContain(LOT_STATUS_LABELS[lot.status].toLowerCase());
		expect(text, lot.code).not.toContain('common practice');
	}
}

test.describe('lot labels, as a prep technician', () => {
	test.use({ role: 'prep_technician' });

	for (const sizeId of LABEL_SIZE_IDS) {
		test(`${sizeId} labels print inside their outlines, with a QR code that reads back as the lot and its status in words`, async ({
			page,
			browser,
			baseURL
		}, testInfo) => {
			const lots = [
				...(await Promise.all(DEMO_SUPPLIER_LOTS.map((s) => findDemoLot(page, s)))),
				await receiveLongLot(browser, baseURL!, `LBL${sizeId.toUpperCase()}${Date.now()}`)
			];
			expect(new Set(lots.map((l) => l.status))).toEqual(
				new Set(['quarantine', 'released', 'rejected'])
			);
			await page.goto(`/lots/labels?${lots.map((l) => `lot=${l.id}`).join('&')}&size=${sizeId}`);
			await expect(page.getByLabel('Label size')).toHaveValue(sizeId);
			await expectLabelTexts(page, lots, sizeId);

			await page.setViewportSize(A4_CONTENT);
			await page.emulateMedia({ media: 'print' });
			await page.evaluate(() => document.fonts.ready);
			const layout = await readLabelLayout(page);
			expect(layout.map((l) => l.code)).toEqual(lots.map((l) => l.code));
			expectInsideOutlines(layout, LABEL_SIZES[sizeId]);

			const pdfPath = testInfo.outputPath(`labels-${sizeId}.pdf`);
			await page.pdf({ path: pdfPath, format: 'A4', printBackground: true });
			const pngPath = renderFirstPage(pdfPath, DPI);
			await testInfo.attach(`labels-${sizeId}.png`, { path: pngPath, contentType: 'image/png' });
			mkdirSync('tests/.tmp/labels', { recursive: true });
			copyFileSync(pngPath, `tests/.tmp/labels/labels-${sizeId}.png`);
			expectPrintedLabels(pdfPath, pngPath, layout, lots);
		});
	}

	test('the size is chosen from the lot list by keyboard, kept in the address, and the page reads on a tablet', async ({
		page
	}, testInfo) => {
		await page.setViewportSize({ width: 768, height: 1024 });
		await page.goto('/lots?q=NR-2');
		const boxes = page.getByRole('checkbox', { name: /^Label for L-/ });
		await expect(boxes.first()).toBeVisible();
		await boxes.nth(0).check();
		await boxes.nth(1).check();
		await page.getByRole('link', { name: 'Print labels (2)' }).click();
		await expect(page).toHaveURL(/\/lots\/labels\?lot=[^&]+&lot=[^&]+$/);
		await expect(page.getByTestId('lot-label')).toHaveCount(2);

		const select = page.getByLabel('Label size');
		await expect(select).toHaveValue('standard');
		await select.focus();
		await page.keyboard.press('ArrowDown');
		await expect(page).toHaveURL(/[?&]size=large(&|$)/);
		await expect(page.getByTestId('label-sheet')).toHaveAttribute('data-size', 'large');
		await expect(select).toBeFocused();
		await expect(page.getByTestId('lot-label')).toHaveCount(2);
		await page.keyboard.press('ArrowUp');
		await page.keyboard.press('ArrowUp');
		await expect(page).toHaveURL(/[?&]size=small(&|$)/);
		await expect(page.getByTestId('label-name')).toHaveCount(0);

		await page.reload();
		await expect(page.getByLabel('Label size')).toHaveValue('small');
		await page.getByLabel('Label size').selectOption('standard');
		await expect(page.getByTestId('label-sheet')).toHaveAttribute('data-size', 'standard');
		const overflow = await page.evaluate(
			() => document.documentElement.scrollWidth - document.documentElement.clientWidth
		);
		expect(overflow, 'no sideways scrolling on a tablet').toBe(0);
		for (const label of await page.getByTestId('lot-label').all()) {
			const box = (await label.boundingBox())!;
			expect(box.x).toBeGreaterThanOrEqual(0);
			expect(box.x + box.width).toBeLessThanOrEqual(768);
		}
		await expect(page.getByRole('button', { name: 'Print labels' })).toBeVisible();
		const screenshot = testInfo.outputPath('labels-tablet.png');
		await page.screenshot({ path: screenshot, fullPage: true });
		await testInfo.attach('labels-tablet.png', { path: screenshot, contentType: 'image/png' });
		mkdirSync('tests/.tmp/labels', { recursive: true });
		copyFileSync(screenshot, 'tests/.tmp/labels/labels-tablet.png');
	});

	test('an unknown size shows the standard size, and lots that do not exist are named as left out', async ({
		page
	}) => {
		const lot = await findDemoLot(page, 'NR-24-0931');
		await page.goto(`/lots/labels?lot=${lot.id}&lot=no-such-lot&size=huge`);
		await expect(page.getByLabel('Label size')).toHaveValue('standard');
		await expect(page.getByTestId('label-sheet')).toHaveAttribute('data-size', 'standard');
		await expect(
			page.getByText('1 of the requested lots do not exist and were left out.')
		).toBeVisible();
		await expect(page.getByTestId('lot-label')).toHaveCount(1);
	});
});
