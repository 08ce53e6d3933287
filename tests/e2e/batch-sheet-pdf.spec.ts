import { mkdirSync } from 'node:fs';
import { planBatch } from './batch-helpers';
import { expect, test } from './fixtures';
import { horizontalRules, pdfPageTexts, readPng, renderPdfPages, writePdf } from './pdf-pages';

// The PDF batch sheet is the printed page on paper: the same table (sheet-table.ts), ruled, with a
// blank for the lot used and for initials on each line, masses as the balance reads them, a
// signature block, and the batch number with page x of y on every page. Checked on the rendered
// pages themselves (poppler's pdftotext and pdftoppm), not on the PDF's internals.
test.describe('the batch sheet on paper', () => {
	test.use({ role: 'prep_technician' });

	test('the PDF carries the on-screen sheet’s table, blanks to fill in, and the batch and page on every page', async ({
		page
	}, testInfo) => {
		// A large batch of the richest demo medium: enough lines and working for more than one page.
		const id = await planBatch(page, 'Paper sheet check, e2e', 20, 'PPN CD Basal M1 · version 1');
		const number = (await page.getByRole('heading', { name: /^Batch / }).textContent())!.replace(
			'Batch ',
			''
		);

		await page.goto(`/batches/${id}/sheet`);
		const screenTable = page.getByRole('table', { name: 'batch sheet lines' });
		const headers = await screenTable.locator('thead th').allTextContents();
		expect(headers.map((h) => h.trim())).toEqual([
			'#',
			'Component',
			'Weigh / add',
			'Suggested lot',
			'Lot used',
			'Actual',
			'Initials'
		]);
		const screenRows = screenTable.locator('tbody tr');
		const rowCount = await screenRows.count();
		expect(rowCount).toBeGreaterThan(5);
		const names: string[] = [];
		const required: string[] = [];
		for (let i = 0; i < rowCount; i++) {
			names.push((await screenRows.nth(i).locator('td').nth(1).locator('strong').textContent())!);
			required.push(
				(await screenRows.nth(i).locator('td').nth(2).locator('strong').textContent())!
			);
		}

		const response = await page.request.get(`/batches/${id}/sheet.pdf`);
		expect(response.headers()['content-type']).toBe('application/pdf');
		const folder = testInfo.outputPath('sheet');
		mkdirSync(folder, { recursive: true });
		const pdfPath = writePdf(`${folder}/sheet.pdf`, await response.body());
		const texts = pdfPageTexts(pdfPath);
		expect(texts.length).toBeGreaterThanOrEqual(2);

		// Every page: the batch number and page x of y; the printing moment in the site's zone.
		texts.forEach((text, i) => {
			expect(text).toContain(`Batch sheet ${number}`);
			expect(text).toContain(`Page ${i + 1} of ${texts.length}`);
			expect(text).toMatch(/Printed \d{4}-\d{2}-\d{2} \d{2}:\d{2} UTC/);
			expect(text).not.toMatch(/\d{4}-\d{2}-\d{2}T\d{2}:\d{2}/);
		});
		const all = texts.join('\n');
		// The table's header row, on one line as a header is (repeated on each page the table runs onto).
		expect(texts[0]).toMatch(
			/#\s+Component\s+Weigh \/ add\s+Suggested lot\s+Lot used\s+Actual\s+Initials/
		);
		// Each line of the screen's table, with the same quantity to weigh or add.
		for (let i = 0; i < rowCount; i++) {
			expect(all.replace(/\s+/g, ' ')).toContain(names[i].split(/\s+/)[0]);
			expect(all).toContain(required[i]);
		}
		// What to weigh or add, as a balance or pipette reads it: at most three decimals of a gram, and
		// the working no longer ends in an unrounded "weigh 11.6917 g".
		for (const text of required) expect(text).toMatch(/^\d+(\.\d{1,3})? (g|mg|mL|µL)$/);
		expect(all).not.toMatch(/weigh \d+\.\d{4,} g/);
		// A signature block with a blank for each signature still to come.
		expect(all).toMatch(/Signatures/);
		expect(all).toMatch(/Prepared by/);
		expect(all).toMatch(/Reviewed by/);

		// The pictures: each page is ruled as a table (many long horizontal rules), and the last page
		// ends with the signature block's rules.
		const pictures = renderPdfPages(pdfPath, folder, 100);
		expect(pictures).toHaveLength(texts.length);
		for (const [i, picture] of pictures.entries()) {
			await testInfo.attach(`sheet page ${i + 1}`, { path: picture, contentType: 'image/png' });
			const png = readPng(picture);
			// The table is 515 pt wide: 715 px at 100 dpi; a rule spans most of it.
			const rules = horizontalRules(png, 600);
			expect(rules.length, `ruled rows on page ${i + 1}`).toBeGreaterThanOrEqual(4);
		}
	});
});
