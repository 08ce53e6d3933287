import type { Browser, Page } from '@playwright/test';
import { DEMO, DEMO_PASSWORD, expect, test, type DemoRole } from './fixtures';
import { addComponent, createRecipe } from './recipe-helpers';

async function signedInPage(browser: Browser, role: DemoRole): Promise<Page> {
	const context = await browser.newContext();
	const page = await context.newPage();
	const response = await page.request.post('/api/v1/session', {
		data: { email: DEMO[role], password: DEMO_PASSWORD }
	});
	expect(response.status()).toBe(200);
	return page;
}

const line = (page: Page, n: number) =>
	page.getByRole('listitem', { name: `Line ${n}`, exact: true });

async function recipeUrlByName(page: Page, name: string): Promise<string> {
	const response = await page.request.get(`/api/v1/recipes?q=${encodeURIComponent(name)}`);
	const body = await response.json();
	expect(body.items.length).toBeGreaterThan(0);
	return `/recipes/${body.items[0].id}`;
}

test.describe('a media scientist', () => {
	test.use({ role: 'media_scientist' });

	test('builds a recipe with live composition, submits it; an engineer approves it with a signature; the author cannot', async ({
		page,
		browser
	}) => {
		// Two people and a dozen steps: more than the default budget of one page's test.
		test.setTimeout(90_000);
		const name = `E2E salts ${Date.now()}`;
		await createRecipe(page, name);

		await addComponent(page, 1, 'Sodium chloride', '6', 'g/L');
		const analysis = page.getByRole('complementary', { name: 'Live analysis' });
		await expect(analysis.getByTestId('osmolality')).toHaveText('191 mOsm/kg');
		await addComponent(page, 2, 'D-Glucose, anhydrous', '20', 'mM');
		await expect(analysis.getByTestId('osmolality')).toHaveText('211 mOsm/kg');
		await expect(analysis.getByTestId('total-carbon')).toHaveText('1.44 g/L');
		await expect(
			analysis.getByRole('table', { name: 'Elements supplied' }).getByRole('row', { name: /^Na / })
		).toBeVisible();

		// Bad input: the error sits next to the line, and every typed line stays.
		await addComponent(page, 3, 'Sodium chloride', '1', 'g/L');
		await expect(line(page, 3).getByTestId('line-errors')).toContainText(
			'Sodium chloride is already on line 1; combine the two lines.'
		);
		// The other lines are still analysed; the wrong one is marked as left out.
		await expect(line(page, 3).getByTestId('line-errors')).toContainText(
			'Left out of the live analysis until it is corrected.'
		);
		await expect(analysis.getByTestId('left-out')).toContainText('Line 3 is left out');
		await expect(analysis.getByTestId('osmolality')).toHaveText('211 mOsm/kg');
		await page.getByLabel('Line 3: component').fill('L-Tyrosine');
		await page.getByLabel('Line 3: amount').fill('0');
		await expect(line(page, 3).getByTestId('line-errors')).toContainText(
			'the amount must be greater than zero, not 0.'
		);
		await page.getByLabel('Line 3: unit').fill('ppm');
		await expect(line(page, 3).getByTestId('line-errors')).toContainText(
			"Unknown concentration unit 'ppm'"
		);
		await expect(page.getByTestId('line')).toHaveCount(3);
		await page.getByLabel('Line 3: amount').fill('2');
		await page.getByLabel('Line 3: unit').fill('g/L');
		await expect(analysis.getByText(/L-Tyrosine at 2 g\/L exceeds its solubility/)).toBeVisible();

		// A refused save keeps everything on screen.
		await page.getByLabel('Line 3: amount').fill('-1');
		await page.getByRole('button', { name: 'Save draft' }).click();
		await expect(page.getByRole('alert').first()).toContainText('Nothing was saved');
		await expect(page.getByLabel('Line 2: component')).toHaveValue('D-Glucose, anhydrous');
		await page.getByRole('button', { name: 'Remove line 3' }).click();
		await page.getByRole('button', { name: 'Move line 2 up' }).click();
		await expect(page.getByLabel('Line 1: component')).toHaveValue('D-Glucose, anhydrous');
		await page.getByLabel('Osmolality from (mOsm/kg)').fill('200');
		await page.getByLabel('Osmolality to (mOsm/kg)').fill('260');
		await expect(analysis.getByTestId('osmolality-verdict')).toHaveText('within the target range');
		await page.getByRole('button', { name: 'Save draft' }).click();
		await expect(page.getByText(/Saved at/)).toBeVisible();

		await page.getByRole('link', { name: 'Back to version' }).click();
		await expect(page.getByRole('table', { name: 'Lines' }).getByRole('row')).toHaveCount(3);
		await page.getByRole('button', { name: 'Submit for review' }).click();
		await expect(page.getByText('Version 1 is submitted for review.')).toBeVisible();
		await expect(page.getByTestId('status').first()).toHaveText('In review');

		// The author is refused: no signature form, and the server refuses a signature sent anyway.
		await expect(
			page.getByText('You wrote this version, so someone else must review and approve it.')
		).toBeVisible();
		await expect(page.getByRole('form', { name: 'Electronic signature' })).toHaveCount(0);
		const versionUrl = new URL(page.url());
		const forced = await page.request.post(`${versionUrl.pathname}?/sign`, {
			form: { meaning: 'approved', password: DEMO_PASSWORD, comment: '' },
			headers: {
				accept: 'application/json',
				'x-sveltekit-action': 'true',
				origin: versionUrl.origin
			}
		});
		expect(await forced.json()).toMatchObject({ type: 'failure', status: 403 });

		// The engineer signs: wrong password first, then the right one.
		const engineer = await signedInPage(browser, 'engineer');
		await engineer.goto(versionUrl.pathname);
		const form = engineer.getByRole('form', { name: 'Electronic signature' });
		await form.getByLabel('Approved: this version is released for use').check();
		await form.getByLabel('Your password').fill('not-the-password');
		await form.getByRole('button', { name: 'Sign' }).click();
		await expect(
			form.getByText('The password is not right for your account; nothing was signed.')
		).toBeVisible();
		await form.getByLabel('Your password').fill(DEMO_PASSWORD);
		await form.getByLabel('Comment (optional)').fill('Range checked');
		await form.getByRole('button', { name: 'Sign' }).click();
		await expect(
			engineer.getByText('Version 1 is approved. Your signature is recorded.')
		).toBeVisible();
		await expect(engineer.getByTestId('status').first()).toHaveText('Approved');
		const signature = engineer.getByTestId('signature');
		await expect(signature).toContainText('Demo Process Engineer');
		await expect(signature).toContainText('approved');
		await expect(signature).toContainText(/\d{4}-\d{2}-\d{2} \d{2}:\d{2} UTC/);

		// The approved version is immutable: no edit link, and the editor sends you back.
		await page.reload();
		await expect(page.getByRole('link', { name: 'Edit draft' })).toHaveCount(0);
		await page.goto(`${versionUrl.pathname}/edit`);
		await expect(page).toHaveURL(versionUrl.pathname);
		await page.goto(`${versionUrl.pathname}/print`);
		await expect(page.getByTestId('print-status')).toHaveText('Approved');
		await expect(page.getByTestId('signature')).toContainText('Demo Process Engineer');
	});

	test('a stale edit is refused, showing the other person’s change and keeping mine', async ({
		page,
		browser
	}) => {
		const url = await recipeUrlByName(page, 'PPN Feed GA-12');
		await page.goto(`${url}/versions/1/edit`);
		const other = await signedInPage(browser, 'media_scientist');
		await other.goto(`${url}/versions/1/edit`);
		await expect(other.getByLabel('Line 1: amount')).toHaveValue('250');
		await expect(page.getByLabel('Line 1: amount')).toHaveValue('250');

		await other.getByLabel('Line 1: amount').fill('240');
		await other.getByRole('button', { name: 'Save draft' }).click();
		await expect(other.getByText(/Saved at/)).toBeVisible();

		await page.getByLabel('Line 2: amount').fill('9');
		await page.getByRole('button', { name: 'Save draft' }).click();
		await expect(page.getByRole('alert').first()).toContainText('saved this draft');
		const conflict = page.getByTestId('conflict');
		await expect(
			conflict.getByRole('row', { name: /D-Glucose, anhydrous 240 g\/L/ })
		).toBeVisible();
		await expect(page.getByLabel('Line 2: amount')).toHaveValue('9');
		await expect(page.getByLabel('Line 1: amount')).toHaveValue('250');

		await conflict.getByRole('button', { name: 'Take theirs, drop my changes' }).click();
		await expect(page.getByLabel('Line 1: amount')).toHaveValue('240');
		await page.getByLabel('Line 1: amount').fill('250');
		await page.getByRole('button', { name: 'Save draft' }).click();
		await expect(page.getByText(/Saved at/)).toBeVisible();
	});

	test('compares two versions line by line', async ({ page }) => {
		const url = await recipeUrlByName(page, 'PPN Yeast Extract Broth Y5');
		await page.goto(url);
		await page.getByRole('button', { name: 'Compare' }).click();
		await expect(
			page.getByRole('heading', { name: 'Compare PPN Yeast Extract Broth Y5' })
		).toBeVisible();
		await expect(page.getByTestId('compare-changed')).toHaveCount(2);
		await expect(page.getByTestId('compare-changed').first()).toContainText('amount 4 g/L → 3 g/L');
		await expect(page.getByText('What changed in this version:')).toBeVisible();
	});

	test('a component CSV with a bad row shows the row and reason and imports nothing', async ({
		page
	}) => {
		await page.goto('/components/import');
		await page
			.getByLabel('…or paste the rows (header first)')
			.fill('name,category,formula\nE2E salt one,salt,KCl\nE2E salt two,salt,Qq9\n');
		await page.getByRole('button', { name: 'Preview' }).click();
		await expect(
			page.getByRole('row', { name: /^3 E2E salt two/ }).getByTestId('row-errors')
		).toContainText('formula:');
		await expect(page.getByRole('button', { name: /^Import/ })).toHaveCount(0);
		await expect(page.getByLabel('…or paste the rows (header first)')).toHaveValue(/E2E salt two/);

		await page.getByLabel('…or paste the rows (header first)').fill('title,formula\nx,NaCl');
		await page.getByRole('button', { name: 'Preview' }).click();
		await expect(page.getByRole('alert')).toContainText(
			'Expected columns: name, category (required)'
		);

		await page.goto('/components');
		await page.getByLabel('Search').fill('E2E salt');
		await page.getByLabel('Search').press('Enter');
		await expect(page).toHaveURL(/[?&]q=E2E\+salt/);
		await expect(page.getByText('No components match')).toBeVisible();

		// Searching, sorting and paging are the server's: the library's 120-odd reference
		// components come a page at a time, sorted by the header clicked.
		await page.goto('/components?q=chloride');
		await page.getByRole('link', { name: /^CAS/ }).click();
		await expect(page).toHaveURL(/sort=casNumber&dir=asc/);
		await expect(page.getByRole('columnheader', { name: /CAS/ })).toHaveAttribute(
			'aria-sort',
			'ascending'
		);
		await expect(page.getByRole('link', { name: 'Calcium chloride dihydrate' })).toBeVisible();
	});

	test('creates a component with the formula read back and its molar mass live', async ({
		page
	}) => {
		await page.goto('/components/new');
		await page.getByLabel('Name', { exact: true }).fill(`E2E sulfate ${Date.now()}`);
		await page.getByLabel('Formula', { exact: true }).fill('MgSO4.7H2O');
		await expect(page.getByTestId('formula-reading')).toContainText('MgSO4·7H2O');
		await expect(page.getByTestId('formula-reading')).toContainText('246 g/mol');
		await page.getByLabel('CAS number (optional)').fill('10034-99-8');
		await page.getByLabel('GHS hazard statements').fill('H999');
		await page.getByRole('button', { name: 'Create component' }).click();
		await expect(
			page.getByText('H999 is not a code we know; give its text too (H999: …).')
		).toBeVisible();
		await expect(page.getByLabel('Formula', { exact: true })).toHaveValue('MgSO4.7H2O');
		await page.getByLabel('GHS hazard statements').fill('H319');
		await page.getByRole('button', { name: 'Create component' }).click();
		await expect(page.getByText('Component created.')).toBeVisible();
		await expect(page.getByText('Causes serious eye irritation')).toBeVisible();
	});
});

test.describe('a prep technician', () => {
	test.use({ role: 'prep_technician' });

	test('reads recipes but is refused editing', async ({ page }) => {
		await page.goto('/recipes');
		await expect(page.getByRole('link', { name: 'PPN Feed GA-12' })).toBeVisible();
		await expect(page.getByRole('link', { name: 'New recipe' })).toHaveCount(0);
		const url = await recipeUrlByName(page, 'PPN Feed GA-12');
		await page.goto(`${url}/versions/1`);
		await expect(page.getByRole('link', { name: 'Edit draft' })).toHaveCount(0);
		await expect(page.getByText(/L-Tyrosine at 3 g\/L exceeds its solubility/)).toBeVisible();
		const response = await page.goto(`${url}/versions/1/edit`);
		expect(response?.status()).toBe(403);
		await expect(page.getByTestId('error-message')).toContainText(
			'This needs the role Media scientist'
		);
		expect((await page.goto('/recipes/new'))?.status()).toBe(403);
		expect((await page.goto('/components/new'))?.status()).toBe(403);
	});
});

test.describe('the recipes API', () => {
	test.use({ role: 'engineer' });

	test('lists, filters and reads versions with composition; refuses bad lines as problem+json', async ({
		page
	}) => {
		const feeds = await (await page.request.get('/api/v1/recipes?kind=feed')).json();
		expect(feeds.items.map((r: { name: string }) => r.name)).toContain('PPN Feed GA-12');
		expect(feeds.items.every((r: { kind: string }) => r.kind === 'feed')).toBe(true);
		const withTrace = await (
			await page.request.get('/api/v1/recipes?component=sodium-selenite')
		).json();
		expect(withTrace.items.map((r: { name: string }) => r.name)).toEqual(['PPN Trace Elements T2']);
		const bad = await page.request.get('/api/v1/recipes?status=finished');
		expect(bad.status()).toBe(400);
		expect(bad.headers()['content-type']).toContain('application/problem+json');

		// Other specs add feeds of their own to the shared database: read this one by name.
		const gaId = feeds.items.find((r: { name: string }) => r.name === 'PPN Feed GA-12').id;
		const recipe = await (await page.request.get(`/api/v1/recipes/${gaId}`)).json();
		expect(recipe.versions[0]).toMatchObject({ n: 1, status: 'draft' });
		const version = await (await page.request.get(`/api/v1/recipes/${gaId}/versions/1`)).json();
		expect(version.lines.length).toBe(11);
		expect(version.composition.warnings[0].kind).toBe('solubility');

		const preview = await page.request.post('/api/v1/recipes/preview', {
			data: {
				lines: [
					{ kind: 'component', componentId: 'sodium-chloride', amount: 0, unit: 'g/L' },
					{ componentId: 'missing-thing', amount: 1, unit: 'mM' }
				]
			}
		});
		expect(preview.status()).toBe(400);
		expect(preview.headers()['content-type']).toContain('application/problem+json');
		const problem = await preview.json();
		expect(problem.errors.map((e: { path: string }) => e.path).sort()).toEqual([
			'lines.0.amount',
			'lines.1.componentId'
		]);

		const components = await (await page.request.get('/api/v1/components?q=glucose')).json();
		expect(components.items.map((c: { id: string }) => c.id)).toContain('d-glucose');
		const openapi = await (await page.request.get('/api/v1/openapi.json')).json();
		expect(Object.keys(openapi.paths)).toEqual(
			expect.arrayContaining(['/api/v1/recipes/preview', '/api/v1/recipes/{id}/versions/{n}'])
		);
	});

	test('answers 401 without a session', async ({ browser }) => {
		const context = await browser.newContext();
		const response = await context.request.get('/api/v1/recipes');
		expect(response.status()).toBe(401);
		await context.close();
	});
});
