import { execFile } from 'node:child_process';
import { promisify } from 'node:util';
import { expect, test } from './fixtures';

// The examples an integrator starts from must work as written: both run here against the test
// server with a token made on the page, as the examples' README tells a reader to do.
const run = promisify(execFile);
const SCOPES = [
	/Read the component library/,
	/Create recipes, write and submit drafts/,
	/Run calculations/,
	/Read and write studies/,
	/Start and close runs/,
	/Who am I/
];

test.use({ role: 'media_scientist' });

test('the curl and Python examples create a draft, preview it and push run data with a token', async ({
	page,
	baseURL
}) => {
	test.slow(); // two programs, each making a recipe and a run over HTTP
	await page.goto('/account/tokens');
	await page.getByLabel('Name').fill('Examples');
	for (const scope of SCOPES) await page.getByRole('checkbox', { name: scope }).check();
	await page.getByRole('button', { name: 'Make the token' }).click();
	const token = await page.getByLabel('The new token').inputValue();
	const env = { ...process.env, BROTHWRIGHT_URL: baseURL!, BROTHWRIGHT_TOKEN: token };

	const shell = await run('sh', ['examples/draft-preview-and-run-data.sh'], { env });
	expect(shell.stdout).toContain('created /api/v1/recipes/');
	expect(shell.stdout).toMatch(/"estimateMOsmPerKg":\d/);
	expect(shell.stdout).toMatch(/"unchanged":3/);
	expect(shell.stdout.trim().endsWith('done')).toBe(true);

	const python = await run('python3', ['examples/draft_preview_and_run_data.py'], { env });
	expect(python.stdout).toMatch(/preview: about \d+ mOsm\/kg/);
	expect(python.stdout).toContain('the same points again');
	expect(python.stdout.trim().endsWith('done')).toBe(true);

	// What they made is there for people: the drafts are in the recipe list, written by this person.
	await page.goto('/recipes?q=Example+basal+medium');
	await expect(page.getByRole('link', { name: /Example basal medium .*\(py\)/ })).toBeVisible();
});
