import type { Page } from '@playwright/test';
import { expect, test } from './fixtures';
import { createRecipe } from './recipe-helpers';

const box = (page: Page, n: number) => page.getByLabel(`Line ${n}: component`);
const lineItem = (page: Page, n: number) =>
	page.getByRole('listitem', { name: `Line ${n}`, exact: true });

/** The list the box controls, found through its aria-controls as assistive technology finds it. */
async function listOf(page: Page, n: number) {
	const id = await box(page, n).getAttribute('aria-controls');
	expect(id).toBeTruthy();
	return page.locator(`[id="${id}"]`);
}

/** Adds a component line and types into its box from the keyboard (the new box has the focus). */
async function typeNewLine(page: Page, n: number, text: string) {
	await page.getByRole('button', { name: 'Add component' }).click();
	await expect(box(page, n)).toBeFocused();
	await page.keyboard.type(text);
}

/** Down to the first option and Enter, checking the box points at it while it is active. */
async function chooseFirstByKeyboard(page: Page, n: number, expected: string) {
	const list = await listOf(page, n);
	const first = list.getByRole('option').first();
	await expect(first).toContainText(expected);
	await page.keyboard.press('ArrowDown');
	await expect(first).toHaveAttribute('aria-selected', 'true');
	await expect(box(page, n)).toHaveAttribute(
		'aria-activedescendant',
		(await first.getAttribute('id'))!
	);
	await page.keyboard.press('Enter');
	await expect(box(page, n)).toHaveValue(expected);
	await expect(box(page, n)).toHaveAttribute('aria-expanded', 'false');
	await expect(list).toBeHidden();
}

test.describe('the component picker in the recipe editor', () => {
	test.use({ role: 'media_scientist' });

	test('finds by formula, common name and a typo, chosen by keyboard alone, and saves what was chosen', async ({
		page
	}) => {
		test.setTimeout(60_000);
		const name = `E2E picker ${Date.now()}`;
		await createRecipe(page, name);

		await typeNewLine(page, 1, 'KCl');
		const combobox = page.getByRole('combobox', { name: 'Line 1: component' });
		await expect(combobox).toHaveAttribute('aria-autocomplete', 'list');
		await expect(combobox).toHaveAttribute('aria-expanded', 'true');
		const list = await listOf(page, 1);
		await expect(list).toHaveAttribute('role', 'listbox');
		await expect(list).toBeVisible();
		// Nothing is chosen until the person moves into the list.
		await expect(combobox).not.toHaveAttribute('aria-activedescendant');
		const potassium = list.getByRole('option').first();
		await expect(potassium).toContainText('Potassium chloride');
		await expect(potassium).toContainText('KCl');
		await expect(potassium).toContainText('Salt');
		await chooseFirstByKeyboard(page, 1, 'Potassium chloride');
		await page.keyboard.press('Tab');
		await expect(page.getByLabel('Line 1: amount')).toBeFocused();
		await page.keyboard.type('0.4');

		// "Glucose" is a synonym of the anhydrous entry: the option says so, with its formula and form.
		await typeNewLine(page, 2, 'Glucose');
		const glucose = (await listOf(page, 2)).getByRole('option').first();
		await expect(glucose).toContainText('D-Glucose, anhydrous');
		await expect(glucose).toContainText('C6H12O6');
		await expect(glucose).toContainText('Sugar, anhydrous');
		await expect(glucose).toContainText('also called glucose');
		await chooseFirstByKeyboard(page, 2, 'D-Glucose, anhydrous');
		await page.keyboard.press('Tab');
		await page.keyboard.type('10');

		// A typo left unchosen: Tab leaves the text as typed, and the server suggests the component.
		await typeNewLine(page, 3, 'Sodium chlorde');
		await expect((await listOf(page, 3)).getByRole('option').first()).toContainText(
			'Sodium chloride'
		);
		await page.keyboard.press('Tab');
		await expect(page.getByLabel('Line 3: amount')).toBeFocused();
		await expect(box(page, 3)).toHaveValue('Sodium chlorde');
		await expect(box(page, 3)).toHaveAttribute('aria-expanded', 'false');
		await page.keyboard.type('5');
		await expect(lineItem(page, 3).getByTestId('line-errors')).toContainText(
			'no component “Sodium chlorde” in the library; did you mean Sodium chloride (NaCl)'
		);
		// A save refused for it keeps the line; choosing the component then clears the refusal.
		await page.getByRole('button', { name: 'Save draft' }).click();
		await expect(page.getByRole('alert').first()).toContainText('Nothing was saved');
		await box(page, 3).focus();
		// Down opens the closed list on its first option.
		await page.keyboard.press('ArrowDown');
		const sodium = (await listOf(page, 3)).getByRole('option').first();
		await expect(sodium).toContainText('Sodium chloride');
		await expect(sodium).toHaveAttribute('aria-selected', 'true');
		await page.keyboard.press('Enter');
		await expect(box(page, 3)).toHaveValue('Sodium chloride');
		await expect(lineItem(page, 3).getByTestId('line-errors')).toHaveCount(0);

		await page.getByRole('button', { name: 'Save draft' }).click();
		await expect(page.getByText(/Saved at/)).toBeVisible();
		// What was saved is the chosen components: the reloaded editor names them from their ids.
		await page.reload();
		await expect(page.locator('html[data-hydrated]')).toBeAttached();
		await expect(box(page, 1)).toHaveValue('Potassium chloride');
		await expect(box(page, 2)).toHaveValue('D-Glucose, anhydrous');
		await expect(box(page, 3)).toHaveValue('Sodium chloride');
		await expect(page.getByLabel('Line 3: amount')).toHaveValue('5');
	});

	test('Escape closes the list, a second Escape clears the box; a click chooses', async ({
		page
	}) => {
		await createRecipe(page, `E2E picker keys ${Date.now()}`);
		await typeNewLine(page, 1, 'sod');
		const list = await listOf(page, 1);
		await expect(list).toBeVisible();
		await page.keyboard.press('ArrowDown');
		await page.keyboard.press('Escape');
		await expect(list).toBeHidden();
		await expect(box(page, 1)).toHaveAttribute('aria-expanded', 'false');
		await expect(box(page, 1)).not.toHaveAttribute('aria-activedescendant');
		await expect(box(page, 1)).toHaveValue('sod');
		await page.keyboard.press('Escape');
		await expect(box(page, 1)).toHaveValue('');

		// Home and End move in the text, as in any text box, and leave the list.
		await page.keyboard.type('Epsom');
		await page.keyboard.press('ArrowDown');
		await page.keyboard.press('Home');
		await expect(box(page, 1)).not.toHaveAttribute('aria-activedescendant');
		await page.keyboard.type('x');
		await expect(box(page, 1)).toHaveValue('xEpsom');
		await page.keyboard.press('Backspace');
		await page.keyboard.press('End');
		await page.keyboard.press('Backspace');
		await expect(box(page, 1)).toHaveValue('Epso');

		const option = list.getByRole('option').first();
		await expect(option).toContainText('Magnesium sulfate heptahydrate');
		await expect(option).toContainText('heptahydrate');
		await expect(option).toContainText('also called Epsom salt');
		await option.click();
		await expect(box(page, 1)).toHaveValue('Magnesium sulfate heptahydrate');
		await expect(box(page, 1)).toBeFocused();
		await expect(list).toBeHidden();
		await expect(page.getByText('Unsaved changes')).toBeVisible();

		// A text the library does not match says so, instead of an empty list.
		await page.getByRole('button', { name: 'Add component' }).click();
		// the new line's box takes focus once it is drawn: typing before that would go elsewhere
		await expect(box(page, 2)).toBeFocused();
		await page.keyboard.type('unobtainium');
		await expect(
			page.getByText('No component in the library matches “unobtainium”.')
		).toBeVisible();
		await expect(box(page, 2)).toHaveAttribute('aria-expanded', 'false');
	});
});
