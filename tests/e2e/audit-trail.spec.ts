import type { Page } from '@playwright/test';
import { expect, test } from './fixtures';

test.use({ role: 'admin' });

/** How far the page and the trail's table reach past their boxes, in CSS pixels. */
async function overflowPx(page: Page) {
	return page.evaluate(() => {
		const root = document.documentElement;
		const table = document.querySelector('table[aria-label="Audit trail"]') as HTMLElement;
		const box = table.parentElement as HTMLElement;
		return {
			page: root.scrollWidth - root.clientWidth,
			table: table.scrollWidth - box.clientWidth
		};
	});
}

test('the trail filtered by a lot reads as sentences and links to the lot', async ({ page }) => {
	await page.goto('/admin/audit');
	await page.getByLabel('Subject type').selectOption('lot');
	await page.getByRole('button', { name: 'Filter' }).click();
	await expect(page).toHaveURL(/type=lot/);

	const firstLot = page
		.getByRole('table', { name: 'Audit trail' })
		.locator('a[href^="/lots/"]', { hasText: /^L-\d{4}-\d{4}$/ })
		.first();
	const href = (await firstLot.getAttribute('href'))!;
	const code = (await firstLot.textContent())!.trim();
	expect(code).toMatch(/^L-\d{4}-\d{4}$/);
	const lotId = href.replace('/lots/', '');

	await page.goto(`/admin/audit?subject=lot:${lotId}`);
	await expect(page.getByText(`Showing only entries about lot ${code}`)).toBeVisible();
	const table = page.getByRole('table', { name: 'Audit trail' });
	await expect(table.getByText(new RegExp(`^Received lot ${code} from `))).toBeVisible();
	await expect(table.locator('tr[data-action="lot.received"] td').nth(3)).not.toContainText(
		'lot.received'
	);
	const rows = table.locator('tbody tr');
	const actions = await rows.evaluateAll((trs) => trs.map((tr) => tr.getAttribute('data-action')));
	// Everything about the lot: its own acts and the signatures on it (release), nothing else.
	expect(actions.every((a) => a?.startsWith('lot.') || a?.startsWith('signature.'))).toBe(true);
	expect(actions).toContain('lot.received');

	await page.screenshot({ path: 'test-results/audit-trail-lot.png', fullPage: true });
	await expect(page.getByRole('link', { name: 'Export this view as CSV' })).toHaveAttribute(
		'href',
		`/admin/audit/export.csv?subject=lot%3A${lotId}`
	);
	await table.getByRole('link', { name: code }).first().click();
	await expect(page).toHaveURL(href);
	await expect(page.getByRole('heading', { level: 1 })).toContainText(code);
});

for (const width of [1024, 1280, 1440]) {
	test(`the trail does not scroll sideways at ${width} px`, async ({ page }) => {
		await page.setViewportSize({ width, height: 900 });
		await page.goto('/admin/audit');
		await expect(page.getByRole('table', { name: 'Audit trail' })).toBeVisible();
		await page.screenshot({ path: `test-results/audit-trail-${width}.png`, fullPage: false });
		const overflow = await overflowPx(page);
		expect(overflow.page).toBeLessThanOrEqual(0);
		expect(overflow.table).toBeLessThanOrEqual(0);
	});
}
