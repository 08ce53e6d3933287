import { expect, test } from './fixtures';

// Tokens as people make and use them: on their page, then from a script over real HTTP.

test.describe('personal API tokens', () => {
	test.use({ role: 'engineer' });

	test('a token is made with its scopes, shown once, works as a Bearer token, and stops when revoked', async ({
		page,
		playwright,
		baseURL
	}) => {
		await page.goto('/account/tokens');
		await page.getByLabel('Name').fill('Run data push');
		await page.getByRole('checkbox', { name: /Read runs, their data/ }).check();
		await page.getByRole('checkbox', { name: /Who am I/ }).check();
		await page.getByLabel('Expires after (days)').fill('30');
		await page.getByRole('button', { name: 'Make the token' }).click();
		const shown = page.getByTestId('token-shown-once');
		await expect(shown).toContainText('shown only this once');
		const token = await page.getByLabel('The new token').inputValue();
		expect(token).toMatch(/^bwt_/);
		await expect(page.getByTestId('token-row').filter({ hasText: 'Run data push' })).toContainText(
			'Live'
		);

		// A script: no cookie, only the header.
		const script = await playwright.request.newContext({ baseURL });
		const me = await script.get('/api/v1/me', { headers: { authorization: `Bearer ${token}` } });
		expect(me.status()).toBe(200);
		expect((await me.json()).email).toBe('engineer@demo.test');
		const runs = await script.get('/api/v1/runs', {
			headers: { authorization: `Bearer ${token}` }
		});
		expect(runs.status()).toBe(200);
		const lots = await script.get('/api/v1/lots', {
			headers: { authorization: `Bearer ${token}` }
		});
		expect(lots.status()).toBe(403);
		expect((await lots.json()).detail).toContain('does not have the scope lot.view');
		const inAddress = await script.get(`/api/v1/me?access_token=${token}`);
		expect(inAddress.status()).toBe(400);

		// Reloading shows the list without the token: it exists nowhere now but in the script.
		await page.reload();
		await expect(page.getByTestId('token-shown-once')).toHaveCount(0);
		await expect(page.getByText(token)).toHaveCount(0);
		const row = page.getByTestId('token-row').filter({ hasText: 'Run data push' });
		await expect(row).not.toContainText('Never');

		await row.getByText('Revoke…').click();
		await row.getByLabel('Why (kept in the audit trail)').fill('end of the trial');
		await row.getByRole('button', { name: /Revoke “Run data push” now/ }).click();
		await expect(page.getByText('Token “Run data push” is revoked.')).toBeVisible();
		const after = await script.get('/api/v1/me', { headers: { authorization: `Bearer ${token}` } });
		expect(after.status()).toBe(401);
		expect((await after.json()).detail).toContain('revoked');
		await script.dispose();
	});

	test('a token without a name or a scope is refused with both fields named, and what was typed stays', async ({
		page
	}) => {
		await page.goto('/account/tokens');
		await page.getByLabel('Name').fill('   ');
		await page.getByLabel('Expires after (days)').fill('400');
		await page.getByRole('button', { name: 'Make the token' }).click();
		await expect(page.getByText('Name the token after what will use it')).toBeVisible();
		await expect(page.getByText('Choose at least one scope')).toBeVisible();
		await expect(page.getByText('Expires after (days) is at most 366.')).toBeVisible();
		await expect(page.getByLabel('Expires after (days)')).toHaveValue('400');
	});
});

test.describe('service tokens', () => {
	test.use({ role: 'admin' });

	test('an administrator makes a service token bound to roles; past its rate it gets 429 with Retry-After', async ({
		page,
		playwright,
		baseURL
	}) => {
		await page.goto('/admin/tokens');
		await page.getByLabel('Name').fill('Hall controller (rate test)');
		await page.getByRole('checkbox', { name: 'Engineer' }).check();
		// The scopes follow the roles ticked: an engineer's service account cannot receive lots.
		await expect(page.getByRole('checkbox', { name: /Receive lots/ })).toHaveCount(0);
		await page.getByRole('checkbox', { name: /Who am I/ }).check();
		await page.getByLabel('Requests a minute').fill('2');
		await page.getByRole('button', { name: 'Make the service token' }).click();
		const token = await page.getByLabel('The new token').inputValue();

		const script = await playwright.request.newContext({ baseURL });
		const headers = { authorization: `Bearer ${token}` };
		const first = await script.get('/api/v1/me', { headers });
		expect(first.status()).toBe(200);
		expect((await first.json()).roles).toEqual(['engineer']);
		expect((await script.get('/api/v1/me', { headers })).status()).toBe(200);
		const limited = await script.get('/api/v1/me', { headers });
		expect(limited.status()).toBe(429);
		expect(Number(limited.headers()['retry-after'])).toBeGreaterThanOrEqual(1);
		await script.dispose();
	});
});
