import type { Page } from '@playwright/test';
import { expect, test } from './fixtures';

const BACTERIUM_STUDY = 'Bacterium glucose fed-batch, pilot (demo)';

async function openDesigner(page: Page) {
	await page.goto('/studies');
	await page.getByRole('link', { name: BACTERIUM_STUDY }).click();
	const designer = page.getByRole('form', { name: 'Feed designer' });
	await expect(designer).toBeVisible();
	return designer;
}

async function addComponent(page: Page, name: string) {
	await page.getByLabel('Add a component').selectOption({ label: name });
	await page.getByRole('button', { name: 'Add', exact: true }).click();
}

const chosen = (page: Page) =>
	page.getByRole('list', { name: 'Components in the feed' }).getByRole('listitem');

test.describe('a media scientist designs a feed and saves it as drafts', () => {
	test.use({ role: 'media_scientist' });

	test('one form per substance, a split proposal the analysis passes, drafts opened in the editor', async ({
		page
	}) => {
		test.setTimeout(60_000);
		await openDesigner(page);
		// The glucose feed weighs MgSO4·7H2O: it is preselected once, not also as anhydrous MgSO4.
		await expect(chosen(page)).toHaveCount(2);
		const magnesium = page.getByLabel('Form of Magnesium sulfate heptahydrate');
		await expect(magnesium).toHaveValue('magnesium-sulfate-heptahydrate');
		await magnesium.selectOption({ label: 'Magnesium sulfate, anhydrous' });
		await expect(page.getByLabel('Form of Magnesium sulfate, anhydrous')).toBeVisible();

		// A second form of a substance already chosen is not added; the user is told why.
		await addComponent(page, 'Magnesium sulfate heptahydrate');
		await expect(page.getByTestId('add-notice')).toContainText(
			'Magnesium sulfate heptahydrate is another form of Magnesium sulfate, anhydrous, which is already in the feed. A feed takes one form of each substance.'
		);
		await expect(chosen(page)).toHaveCount(2);

		for (const name of [
			'Ammonium sulfate',
			'Calcium chloride, anhydrous',
			'Iron(II) sulfate heptahydrate',
			'Sodium dihydrogen phosphate, anhydrous'
		])
			await addComponent(page, name);
		await expect(chosen(page)).toHaveCount(6);
		await page.getByLabel('Feed volume in all, L').fill('30');
		await page.getByRole('button', { name: 'Propose a feed' }).click();

		const feeds = page.getByTestId('proposed-feed');
		await expect(feeds).toHaveCount(2);
		await expect(page.getByTestId('split-reasons')).toContainText('calcium phosphate');
		for (const feed of await feeds.all()) {
			await expect(feed.getByTestId('feed-no-warnings')).toHaveText(
				'Recipe analysis: no solubility or precipitation warnings at 25 °C.'
			);
			await expect(feed.getByTestId('feed-osmolality')).toContainText('limit 4000');
		}
		const feedA = page.getByRole('table', { name: 'Lines of Feed A' });
		await expect(feedA.getByRole('row')).toHaveCount(4);
		const firstLine = (
			await feedA.getByRole('row').nth(1).getByRole('cell').first().innerText()
		).trim();

		const stamp = Date.now();
		await page.getByLabel('Draft name for Feed A').fill(`E2E designed feed A ${stamp}`);
		await page.getByLabel('Draft name for Feed B').fill(`E2E designed feed B ${stamp}`);
		await page.getByRole('button', { name: 'Save as two feed drafts' }).click();

		await expect(
			page.getByRole('heading', { name: `Edit E2E designed feed A ${stamp} · version 1` })
		).toBeVisible();
		await expect(page).toHaveURL(/\/recipes\/[^/]+\/versions\/1\/edit$/);
		await expect(page.getByTestId('line')).toHaveCount(3);
		await expect(page.getByLabel('Line 1: component')).toHaveValue(firstLine);
		const analysis = page.getByRole('complementary', { name: 'Live analysis' });
		await expect(analysis.getByTestId('no-warnings')).toBeVisible();
		await expect(analysis.getByTestId('osmolality-verdict')).toHaveText('within the target range');
	});

	test('bad input is named beside its field, by keyboard too, and nothing typed is lost', async ({
		page
	}) => {
		await openDesigner(page);
		const volume = page.getByLabel('Feed volume in all, L');
		await volume.fill('500');
		await volume.press('Enter');
		await expect(page.locator('#field-design\\.feedVolumeL-error')).toContainText(
			'at most 80 L fits'
		);
		await expect(volume).toHaveValue('500');

		await volume.fill('30');
		await page.getByLabel('Osmolality limit per feed, mOsm/kg').fill('many');
		await page.getByRole('button', { name: 'Propose a feed' }).click();
		await expect(page.locator('#field-design\\.osmolalityMaxMOsmPerKg-error')).toHaveText(
			'Give a number.'
		);
		await page.getByLabel('Osmolality limit per feed, mOsm/kg').fill('4000');

		await page.getByRole('button', { name: 'Remove D-Glucose, anhydrous' }).click();
		await page.getByRole('button', { name: 'Remove Magnesium sulfate heptahydrate' }).focus();
		await page.keyboard.press('Enter');
		await expect(chosen(page)).toHaveText(['No component chosen yet.']);
		await page.getByRole('button', { name: 'Propose a feed' }).click();
		await expect(page.getByTestId('component-error')).toHaveText('Choose at least one component.');
	});
});

test.describe('an engineer', () => {
	test.use({ role: 'engineer' });

	test('gets the proposal but no way to save it, and the server refuses the save', async ({
		page
	}) => {
		await openDesigner(page);
		await page.getByLabel('Feed volume in all, L').fill('30');
		await addComponent(page, 'Ammonium sulfate');
		await addComponent(page, 'Calcium chloride, anhydrous');
		await addComponent(page, 'Iron(II) sulfate heptahydrate');
		await addComponent(page, 'Sodium dihydrogen phosphate, anhydrous');
		await page.getByRole('button', { name: 'Propose a feed' }).click();
		await expect(page.getByTestId('proposed-feed')).toHaveCount(2);
		await expect(page.getByTestId('save-needs-role')).toContainText('Media scientist');
		await expect(page.getByRole('button', { name: /Save as/ })).toHaveCount(0);

		const studyPath = new URL(page.url()).pathname;
		const response = await page.request.post(`/api/v1${studyPath}/feed-design/drafts`, {
			data: {
				componentIds: ['d-glucose', 'magnesium-sulfate-heptahydrate'],
				feedVolumeL: 30,
				temperatureC: 25,
				names: ['Engineer feed']
			}
		});
		expect(response.status()).toBe(403);
		expect((await response.json()).detail).toMatch(/needs the role Media scientist/);
	});
});
