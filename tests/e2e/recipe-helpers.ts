import type { Page } from '@playwright/test';
import { expect } from './fixtures';

/** Adds a component line to the open editor, picks the component by its name, types amount and unit. */
export async function addComponent(
	page: Page,
	n: number,
	name: string,
	amount: string,
	unit: string
) {
	await page.getByRole('button', { name: 'Add component' }).click();
	const box = page.getByLabel(`Line ${n}: component`);
	await box.fill(name);
	await page
		.getByRole('listbox', { name: `Components matching “${name}”` })
		.getByRole('option')
		.filter({ has: page.getByText(name, { exact: true }) })
		.click();
	await expect(box).toHaveValue(name);
	await expect(box).toHaveAttribute('aria-expanded', 'false');
	await page.getByLabel(`Line ${n}: amount`).fill(amount);
	await page.getByLabel(`Line ${n}: unit`).fill(unit);
}

/** Creates a basal recipe from the recipe list and waits for its editor. */
export async function createRecipe(page: Page, name: string) {
	await page.goto('/recipes');
	await expect(page.locator('html[data-hydrated]')).toBeAttached();
	await page.getByRole('link', { name: 'New recipe' }).click();
	// The link navigates in the page: type only once the new page is there, or the typing is lost.
	await expect(page.getByRole('heading', { name: 'New recipe', level: 1 })).toBeVisible();
	await page.getByLabel('Name').fill(name);
	await page.getByLabel('Kind').selectOption('basal');
	await expect(page.getByLabel('Name')).toHaveValue(name);
	await page.getByRole('button', { name: 'Create and edit' }).click();
	await expect(page.getByRole('heading', { name: `Edit ${name} · version 1` })).toBeVisible();
}
