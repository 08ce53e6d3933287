import type { Page } from '@playwright/test';
import { expect } from './fixtures';

/**
 * Plans a batch (the demo's salts medium, 1 L, unless told) as the signed-in person; its id.
 */
export async function planBatch(
	page: Page,
	use: string,
	volumeL = 1,
	recipe = 'NB-Min Salts 3 · version 1'
): Promise<string> {
	await page.goto('/batches/new');
	await page.getByLabel('Recipe (approved version)').selectOption({ label: recipe });
	await page.getByLabel('Target volume (L)').fill(String(volumeL));
	await page.getByLabel('Intended use (vessel or run)').fill(use);
	await page.getByRole('button', { name: 'Plan the batch' }).click();
	await expect(page.getByRole('heading', { name: /^Batch MB-\d{4}-\d{4}$/ })).toBeVisible();
	return page.url().split('/').pop()!;
}
