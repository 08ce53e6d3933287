import type { Page, TestInfo } from '@playwright/test';
import { expect, test } from './fixtures';
import { addComponent, createRecipe } from './recipe-helpers';

// The editor at the sizes it is used at: one row per line on a 1024 px screen, a usable two-row
// layout on a portrait tablet, the analysis beside the lines on a wide screen and scrolling within it.
async function editorWithLines(page: Page) {
	await createRecipe(page, `E2E layout ${Date.now()}`);
	await addComponent(page, 1, 'Sodium chloride', '6', 'g/L');
	await addComponent(page, 2, 'Potassium chloride', '0.4', 'g/L');
	await addComponent(page, 3, 'Glycine', '0.1', 'g/L');
	await expect(page.getByTestId('line')).toHaveCount(3);
	// The live analysis runs a moment after typing stops. Until the one that reads every field has
	// landed, a line caught half-typed is still marked as left out, which adds a row to it.
	await expect(page.getByText('Left out of the live analysis until it is corrected.')).toHaveCount(
		0
	);
}

async function shoot(page: Page, testInfo: TestInfo, name: string) {
	await testInfo.attach(name, {
		body: await page.screenshot({ fullPage: true }),
		contentType: 'image/png'
	});
}

async function topOf(page: Page, label: string) {
	const box = await page.getByLabel(label, { exact: true }).boundingBox();
	expect(box, label).not.toBeNull();
	return box!;
}

const noSideScroll = (page: Page) =>
	page.evaluate(() => document.documentElement.scrollWidth <= window.innerWidth);

test.describe('recipe editor layout', () => {
	test.use({ role: 'media_scientist' });

	test('at 1024 px each line is one row and nothing scrolls sideways', async ({
		page
	}, testInfo) => {
		await page.setViewportSize({ width: 1024, height: 768 });
		await editorWithLines(page);
		// Let the live analysis land first: it changes what sits above the lines.
		await expect(page.getByTestId('analysis-summary')).toContainText(/Analysis: ≈ \d+ mOsm\/kg/);
		// Every top is read in one synchronous pass, relative to its own line, so neither a scroll nor
		// a late notice between two reads can move one field and not the other.
		const line = page.getByTestId('line').nth(1);
		const offsets = await line.evaluate((row) => {
			const rowTop = row.getBoundingClientRect().top;
			const topOf = (selector: string) => {
				const el = row.querySelector(selector);
				return el ? el.getBoundingClientRect().top - rowTop : null;
			};
			return {
				component: topOf('input[role="combobox"]'),
				amount: topOf('input[name$=".amount"]'),
				unit: topOf('input[name$=".unit"]:not([type="hidden"])'),
				tolerance: topOf('input[name$=".tolerancePercent"]'),
				note: topOf('input[name$=".note"]'),
				remove: topOf('button[aria-label="Remove line 2"]'),
				height: row.getBoundingClientRect().height
			};
		});
		expect(offsets.component, 'the component field').not.toBeNull();
		for (const key of ['amount', 'unit', 'tolerance', 'note', 'remove'] as const) {
			expect(offsets[key], `${key} in line 2`).not.toBeNull();
			expect(
				Math.abs(offsets[key]! - offsets.component!),
				`${key} on the row of the component`
			).toBeLessThan(4);
		}
		// one row of fields, with the value as read in small type below the numbers
		expect(offsets.height).toBeLessThan(110);
		expect(await noSideScroll(page)).toBe(true);
		await shoot(page, testInfo, 'editor-1024.png');
	});

	test('at 768 px a line takes two rows, every field is on screen', async ({ page }, testInfo) => {
		await page.setViewportSize({ width: 768, height: 1024 });
		await editorWithLines(page);
		const component = await topOf(page, 'Line 1: component');
		const note = await topOf(page, 'Line 1: note');
		expect(note.y).toBeGreaterThan(component.y + 20);
		for (const label of ['Line 1: component', 'Line 1: amount', 'Line 1: unit', 'Line 1: note']) {
			const box = await topOf(page, label);
			expect(box.x, label).toBeGreaterThanOrEqual(0);
			expect(box.x + box.width, label).toBeLessThanOrEqual(768);
			expect(box.width, `${label} wide enough to type in`).toBeGreaterThan(60);
		}
		expect(await noSideScroll(page)).toBe(true);
		await shoot(page, testInfo, 'editor-768.png');
	});

	test('on a wide screen the analysis is beside the lines and scrolls within the screen', async ({
		page
	}, testInfo) => {
		await page.setViewportSize({ width: 1600, height: 700 });
		await editorWithLines(page);
		const panel = page.getByRole('complementary', { name: 'Live analysis' });
		await expect(panel.getByText(/mOsm\/kg/).first()).toBeVisible();
		const box = await panel.boundingBox();
		const lines = await page.getByTestId('line').first().boundingBox();
		expect(box!.x).toBeGreaterThan(lines!.x + lines!.width);
		expect(box!.height).toBeLessThanOrEqual(700);
		expect(await panel.evaluate((el) => getComputedStyle(el).overflowY)).toBe('auto');
		await expect(page.getByTestId('analysis-summary')).toBeHidden();
		await shoot(page, testInfo, 'editor-1600.png');
	});
});

test.describe('recipe editor by keyboard', () => {
	test.use({ role: 'media_scientist' });

	test('a skip link, and focus that follows add, move and remove', async ({ page }) => {
		await page.goto('/recipes');
		await page.keyboard.press('Tab');
		const skip = page.getByRole('link', { name: 'Skip to content' });
		await expect(skip).toBeFocused();
		await expect(skip).toBeInViewport();
		await page.keyboard.press('Enter');
		await expect(page.locator('main')).toBeFocused();
		await page.keyboard.press('Tab');
		// the next stop is in the page's content, not back in the navigation
		await expect(page.locator('main :focus')).toHaveCount(1);

		await editorWithLines(page);

		await page.getByRole('button', { name: 'Move line 2 up' }).focus();
		await page.keyboard.press('Enter');
		// At the top the up arrow is disabled: focus stays on the moved line, on its down arrow.
		await expect(page.getByRole('button', { name: 'Move line 1 down' })).toBeFocused();
		await expect(page.getByLabel('Line 1: component', { exact: true })).toHaveValue(
			'Potassium chloride'
		);
		await page.keyboard.press('Enter');
		await expect(page.getByRole('button', { name: 'Move line 2 down' })).toBeFocused();

		await page.getByRole('button', { name: 'Remove line 2' }).focus();
		await page.keyboard.press('Enter');
		await expect(page.getByTestId('line')).toHaveCount(2);
		// The line that took its place has focus, and the change is said.
		await expect(page.getByLabel('Line 2: component', { exact: true })).toBeFocused();
		await expect(page.getByText('Line 2 removed; 2 lines left.')).toBeAttached();

		await page.getByRole('button', { name: 'Remove line 2' }).focus();
		await page.keyboard.press('Enter');
		await expect(page.getByLabel('Line 1: component', { exact: true })).toBeFocused();
		await page.getByRole('button', { name: 'Remove line 1' }).focus();
		await page.keyboard.press('Enter');
		await expect(page.getByRole('button', { name: 'Add component' })).toBeFocused();
		await page.keyboard.press('Enter');
		await expect(page.getByLabel('Line 1: component', { exact: true })).toBeFocused();
	});
});
