import { expect, test } from './fixtures';
import { createRecipe } from './recipe-helpers';

// A version's CSV carries its lines and its own fields; importing the export back with Replace
// gives the same draft instead of "already on line N" for every row.
test.describe('recipe CSV round trip', () => {
	test.use({ role: 'media_scientist' });

	test('Replace takes the file’s lines and fields; its own export imports back cleanly', async ({
		page
	}) => {
		test.setTimeout(60_000);
		const name = `E2E csv ${Date.now()}`;
		await createRecipe(page, name);
		const versionPath = new URL(page.url()).pathname.replace(/\/edit$/, '');

		await page.goto(`${versionPath}/import`);
		const paste = page.getByLabel('…or paste the rows (header first)');
		await paste.fill(
			[
				'# target_ph: 7.1',
				'# shelf_life_days: 30',
				'# instructions: "Dissolve in 900 mL.\\nMake up to 1 L."',
				'component,amount,unit',
				'Sodium chloride,6,g/L',
				'Potassium chloride,0.4,g/L',
				'Glycine,15,mg/L'
			].join('\n')
		);
		await expect(page.getByRole('radio', { name: /^Replace:/ })).toBeChecked();
		await page.getByRole('button', { name: 'Preview' }).click();
		const effect = page.getByTestId('import-effect');
		await expect(effect).toContainText('Replaces the draft’s 0 lines with the file’s 3 lines.');
		const changes = page.getByRole('table', { name: 'Version fields the file changes' });
		await expect(changes.getByRole('row', { name: /Target pH/ })).toContainText('7.1');
		await expect(changes.getByRole('row', { name: /Shelf life/ })).toContainText('30');
		await page.getByRole('button', { name: 'Import 3 rows' }).click();
		await expect(
			page.getByText('Version 1 now has the file’s 3 lines and its fields.')
		).toBeVisible();

		const exported = await page.request.get(`${versionPath}/export.csv`);
		const csv = await exported.text();
		expect(csv).toContain('# target_ph: 7.1');
		expect(csv).toContain('# instructions: "Dissolve in 900 mL.\\nMake up to 1 L."');

		await page.goto(`${versionPath}/import`);
		await paste.fill(csv);
		await page.getByRole('button', { name: 'Preview' }).click();
		await expect(page.getByTestId('row-errors').filter({ hasText: /\S/ })).toHaveCount(0);
		await expect(effect).toContainText(
			'The version fields stay as they are: the file gives none that differ.'
		);
		await page.getByRole('button', { name: 'Import 3 rows' }).click();
		await expect(
			page.getByText('Version 1 now has the file’s 3 lines and its fields.')
		).toBeVisible();

		// Adding the same file after the draft's lines is refused row by row: each is already there.
		await paste.fill(csv);
		await page.getByRole('radio', { name: /^Add after/ }).check();
		await page.getByRole('button', { name: 'Preview' }).click();
		await expect(page.getByTestId('row-errors').first()).toContainText('already on line 1');
		await expect(effect).toContainText('adding lines leaves the draft’s fields as they are');
	});
});
