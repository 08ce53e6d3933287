import AxeBuilder from '@axe-core/playwright';
import type { Page, TestInfo } from '@playwright/test';
import { expect, test, type DemoRole } from './fixtures';

// axe-core (WCAG 2.1 A and AA rules) on every main page, as each role sees it. A serious or critical
// violation fails the build; minor and moderate ones are attached to the report for reading.
const WCAG_TAGS = ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa'];
const BLOCKING = new Set(['serious', 'critical']);

async function checkPage(page: Page, testInfo: TestInfo, path: string, navigate = true) {
	if (navigate) await page.goto(path);
	await expect(page.locator('main, form').first()).toBeVisible();
	// label-content-name-mismatch (WCAG 2.5.3: a control's visible words are in its accessible name)
	// is experimental in axe-core, so off unless asked for.
	const results = await new AxeBuilder({ page })
		.withTags(WCAG_TAGS)
		.options({ rules: { 'label-content-name-mismatch': { enabled: true } } })
		.analyze();
	const blocking = results.violations.filter((v) => BLOCKING.has(v.impact ?? ''));
	await testInfo.attach(`axe ${path}`, {
		body: JSON.stringify(results.violations, null, 2),
		contentType: 'application/json'
	});
	return blocking.map(
		(v) =>
			`${path}: ${v.impact} ${v.id} (${v.help}) at ${v.nodes
				.slice(0, 3)
				.map((n) => n.target.join(' '))
				.join(', ')}`
	);
}

/** The first link on a list page whose path matches, e.g. the first recipe of the recipe list. */
async function firstLink(page: Page, listPath: string, pattern: RegExp): Promise<string | null> {
	await page.goto(listPath);
	const hrefs = await page
		.locator('main a[href]')
		.evaluateAll((links) => links.map((a) => a.getAttribute('href') ?? ''));
	// a file download (export.csv …) is not a page
	return hrefs.find((href) => pattern.test(href) && !/\.\w+$/.test(href)) ?? null;
}

const PAGES_BY_ROLE: Record<DemoRole, { fixed: string[]; details: [string, RegExp][] }> = {
	media_scientist: {
		fixed: [
			'/',
			'/recipes',
			'/recipes/new',
			'/components',
			'/components/import',
			'/account/password',
			'/account/tokens'
		],
		details: [
			['/recipes', /^\/recipes\/(?!new$)[^/]+$/],
			['/components', /^\/components\/(?!new$|import$)[^/]+$/]
		]
	},
	engineer: {
		fixed: [
			'/',
			'/studies',
			'/studies/new',
			'/organisms',
			'/vessels',
			'/simulation',
			'/runs',
			'/runs/new'
		],
		details: [
			['/runs', /^\/runs\/(?!new$)[^/]+$/],
			['/studies', /^\/studies\/(?!new$)[^/]+$/],
			['/organisms', /^\/organisms\/(?!new$)[^/]+$/],
			['/vessels', /^\/vessels\/(?!new$)[^/]+$/]
		]
	},
	prep_technician: {
		fixed: ['/', '/batches', '/batches/open'],
		details: [['/batches', /^\/batches\/(?!new$|open$)[^/]+$/]]
	},
	inventory_lead: {
		fixed: ['/', '/lots', '/inventory', '/lots/import'],
		details: [['/lots', /^\/lots\/(?!receive$|import$|labels$)[^/]+$/]]
	},
	admin: {
		fixed: [
			'/',
			'/admin/people',
			'/admin/outbox',
			'/admin/audit',
			'/admin/settings',
			'/admin/tokens'
		],
		details: []
	}
};

for (const [role, pages] of Object.entries(PAGES_BY_ROLE) as [
	DemoRole,
	(typeof PAGES_BY_ROLE)[DemoRole]
][]) {
	test.describe(`accessibility as the ${role.replace('_', ' ')}`, () => {
		test.use({ role });

		test('no serious or critical axe violation on the main pages', async ({ page }, testInfo) => {
			test.setTimeout(120_000);
			const paths = [...pages.fixed];
			for (const [list, pattern] of pages.details) {
				const href = await firstLink(page, list, pattern);
				expect(href, `a link on ${list} matching ${pattern}`).not.toBeNull();
				paths.push(href!);
			}
			const problems: string[] = [];
			for (const path of paths) problems.push(...(await checkPage(page, testInfo, path)));
			expect(problems).toEqual([]);
		});
	});
}

test.describe('accessibility of the recipe editor and a version', () => {
	test.use({ role: 'media_scientist' });

	test('no serious or critical axe violation while editing', async ({ page }, testInfo) => {
		test.setTimeout(90_000);
		const version = await firstLink(page, '/recipes', /^\/recipes\/(?!new$)[^/]+$/);
		await page.goto(version!);
		const versionHref = await page
			.locator('main a[href*="/versions/"]')
			.first()
			.getAttribute('href');
		const problems = await checkPage(page, testInfo, versionHref!);
		await page.goto('/recipes/new');
		await page.getByLabel('Name').fill(`Axe editor ${Date.now()}`);
		await page.getByLabel('Kind').selectOption('basal');
		await page.getByRole('button', { name: 'Create and edit' }).click();
		await expect(page.getByRole('heading', { name: /^Edit / })).toBeVisible();
		await page.getByRole('button', { name: 'Add component' }).click();
		const editor = new URL(page.url()).pathname;
		problems.push(...(await checkPage(page, testInfo, editor, false)));
		expect(problems).toEqual([]);
	});
});

test('no serious or critical axe violation on the sign-in page', async ({ page }, testInfo) => {
	expect(await checkPage(page, testInfo, '/login')).toEqual([]);
});
