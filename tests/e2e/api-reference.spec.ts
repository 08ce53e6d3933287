import AxeBuilder from '@axe-core/playwright';
import { test as plainTest } from '@playwright/test';
import { expect, test } from './fixtures';

// The API reference: open to anyone, readable on a tablet and a desktop screen, usable from the
// keyboard, and on paper without the page's navigation. It sends no script (csr = false), so the
// signed-out visits use Playwright's own page, which does not wait for the app to take over.

for (const [label, viewport] of [
	['a tablet (768 px)', { width: 768, height: 1024 }],
	['a desktop screen (1440 px)', { width: 1440, height: 900 }]
] as const) {
	plainTest(
		`reads on ${label} without sideways scrolling${viewport.width > 768 ? '' : ' or serious axe findings'}`,
		async ({ page }) => {
			// axe reads every one of the page's many table cells.
			plainTest.setTimeout(120_000);
			await page.setViewportSize(viewport);
			await page.goto('/api-reference');
			await expect(page.getByRole('heading', { level: 1, name: 'API reference' })).toBeVisible();
			await expect(page.getByRole('navigation', { name: 'Contents' })).toBeVisible();
			const simulate = page.locator('#postSimulate');
			await expect(
				simulate.getByRole('heading', { name: /POST\s+\/api\/v1\/simulate/ })
			).toBeVisible();
			await expect(simulate.getByText('Process engineer or Media scientist')).toBeVisible();
			await expect(
				simulate
					.getByRole('table', { name: 'Request body of postSimulate' })
					.getByRole('rowheader', {
						name: 'muMaxPerH'
					})
			).toBeVisible();
			const overflow = await page.evaluate(
				() => document.documentElement.scrollWidth - window.innerWidth
			);
			expect(overflow).toBeLessThanOrEqual(0);
			// The markup is the same at both widths: axe, which takes about a minute on this page,
			// reads it once, at the narrower one.
			if (viewport.width > 768) return;
			const results = await new AxeBuilder({ page })
				.withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa'])
				.analyze();
			const blocking = results.violations.filter((v) =>
				['serious', 'critical'].includes(v.impact!)
			);
			expect(blocking.map((v) => `${v.id}: ${v.nodes[0]?.target.join(' ')}`)).toEqual([]);
		}
	);
}

plainTest(
	'is used from the keyboard: skip link, then a contents entry to its operation',
	async ({ page }) => {
		await page.goto('/api-reference');
		await page.keyboard.press('Tab');
		const skip = page.getByRole('link', { name: 'Skip to the reference' });
		await expect(skip).toBeFocused();
		await page.keyboard.press('Enter');
		await expect(page.locator('#reference')).toBeFocused();
		const entry = page
			.getByRole('navigation', { name: 'Contents' })
			.getByRole('link', { name: /DELETE\s*\/scenarios\/\{id\}/ });
		await entry.focus();
		await page.keyboard.press('Enter');
		await expect(page).toHaveURL(/#deleteScenariosById$/);
		await expect(page.locator('#deleteScenariosById').getByText('No content.')).toBeInViewport();
	}
);

plainTest('prints the reference without its contents list and links back', async ({ page }) => {
	await page.goto('/api-reference');
	await page.emulateMedia({ media: 'print' });
	await expect(page.getByRole('navigation', { name: 'Contents' })).toBeHidden();
	await expect(page.getByRole('link', { name: 'Back to Brothwright' })).toBeHidden();
	await expect(page.locator('#getRunsByIdAnalysis')).toBeVisible();
});

test.describe('signed in', () => {
	test.use({ role: 'prep_technician' });

	test('the app’s footer leads to the reference', async ({ page }) => {
		await page.goto('/');
		await page.getByRole('main').getByRole('link', { name: 'API reference' }).click();
		await expect(page.getByRole('heading', { level: 1, name: 'API reference' })).toBeVisible();
		await expect(page.getByRole('link', { name: 'API tokens' })).toHaveAttribute(
			'href',
			'/account/tokens'
		);
	});
});
