import { readFileSync } from 'node:fs';
import { expect, test } from './fixtures';

test.use({ role: 'engineer' });

const suffix = () => crypto.randomUUID().slice(0, 6);

test('an engineer feeds glucose by DO-stat beside a substrate-free stream, saves the scenario and loads both streams back', async ({
	page
}) => {
	await page.goto('/simulation');
	await page.getByLabel('Feeding strategy').selectOption('doStat');
	await page.getByLabel('Pump maximum (L/h)').fill('0.1');
	await page.getByLabel('Stream label (optional)').fill('Glucose');

	await page.getByRole('button', { name: 'Add a feed stream' }).click();
	const first = page.getByRole('group', { name: 'Feed stream 1' });
	const second = page.getByRole('group', { name: 'Feed stream 2' });
	await expect(second.getByLabel('Feeding strategy')).toBeFocused();
	await expect(first.getByLabel('Stream label (optional)')).toHaveValue('Glucose');
	await second.getByLabel('Stream label (optional)').fill('Amino acids');
	await second.getByLabel('Substrate in feed or fresh medium Sf (g/L)').fill('0');
	await second.getByLabel('Start (h)').fill('10');
	await second.getByLabel('Feed rate F (L/h)').fill('0.01');

	await page.getByRole('button', { name: 'Run simulation' }).click();
	await expect(page.getByTestId('run-message')).toContainText('Simulated');
	await expect(page.getByTestId('chart-volume').locator('canvas')).toHaveAttribute(
		'data-series',
		'Volume V | Total feed rate F | Glucose | Amino acids'
	);
	const deliveries = page.getByTestId('feed-deliveries');
	await expect(deliveries.getByRole('row', { name: /Glucose DO-stat \d+\.\d{3}/ })).toBeVisible();
	// 0.01 L/h from 10 h to the end at 24 h: 0.140 L.
	await expect(
		deliveries.getByRole('row', { name: 'Amino acids Constant rate 0.140' })
	).toBeVisible();

	const downloading = page.waitForEvent('download');
	await page.getByRole('button', { name: 'Export CSV' }).click();
	const header = readFileSync(await (await downloading).path(), 'utf8').split('\n')[0];
	expect(
		header.endsWith(
			',feed_l_per_h,our_mmol_per_l_h,max_otr_mmol_per_l_h,feed_1_l_per_h (Glucose),feed_2_l_per_h (Amino acids)'
		)
	).toBe(true);

	const name = `Glucose DO-stat and amino acids ${suffix()}`;
	await page.getByLabel('Scenario name').fill(name);
	await page.getByRole('button', { name: 'Save current inputs' }).click();
	await expect(page.getByText(`Saved “${name}”.`)).toBeVisible();

	await page.reload();
	await expect(page.getByRole('group', { name: 'Feed stream 2' })).toHaveCount(0);
	await page.getByRole('button', { name: `Load ${name}` }).click();
	await expect(page.getByTestId('run-message')).toContainText(`Loaded “${name}”`);
	await expect(first.getByLabel('Feeding strategy')).toHaveValue('doStat');
	await expect(first.getByLabel('Stream label (optional)')).toHaveValue('Glucose');
	await expect(first.getByLabel('Pump maximum (L/h)')).toHaveValue('0.1');
	await expect(second.getByLabel('Feeding strategy')).toHaveValue('constant');
	await expect(second.getByLabel('Stream label (optional)')).toHaveValue('Amino acids');
	await expect(second.getByLabel('Substrate in feed or fresh medium Sf (g/L)')).toHaveValue('0');
	await expect(second.getByLabel('Start (h)')).toHaveValue('10');
	await expect(second.getByLabel('Feed rate F (L/h)')).toHaveValue('0.01');
});

test('a bad value in the second stream is shown at that stream’s field, and a stream is removed from the keyboard', async ({
	page
}) => {
	await page.goto('/simulation');
	await page.getByRole('button', { name: 'Add a feed stream' }).click();
	const first = page.getByRole('group', { name: 'Feed stream 1' });
	const second = page.getByRole('group', { name: 'Feed stream 2' });
	await second.getByLabel('Substrate in feed or fresh medium Sf (g/L)').fill('0');
	await second.getByLabel('Feed rate F (L/h)').fill('lots');
	await page.getByRole('button', { name: 'Run simulation' }).click();
	await expect(second.getByLabel('Feed rate F (L/h)')).toHaveAccessibleDescription(
		'Feed rate F (L/h): “lots” is not a number.'
	);
	await expect(second.getByLabel('Feed rate F (L/h)')).toBeFocused();

	await second.getByLabel('Feed rate F (L/h)').fill('-0.01');
	await page.getByRole('button', { name: 'Run simulation' }).click();
	await expect(second.getByLabel('Feed rate F (L/h)')).toHaveAccessibleDescription(
		/^Feed stream 2 rate F must be greater than 0/
	);
	await expect(second.getByLabel('Feed rate F (L/h)')).toHaveValue('-0.01');
	await expect(page.getByTestId('run-message')).toContainText('Feed stream 2');
	await expect(first.getByLabel('Set growth rate μset (1/h)')).not.toHaveAttribute('aria-invalid');

	await page.getByRole('button', { name: 'Remove feed stream 2' }).focus();
	await page.keyboard.press('Enter');
	await expect(second).toHaveCount(0);
	await expect(page.getByRole('button', { name: 'Add a feed stream' })).toBeFocused();
	await expect(page.getByLabel('Set growth rate μset (1/h)')).toHaveValue('0.2');
	await page.getByRole('button', { name: 'Run simulation' }).click();
	await expect(page.getByTestId('run-message')).toContainText('241 output points');
});

test('a scenario with more streams than the page edits is not loaded, and the form keeps what was typed', async ({
	page
}) => {
	const stream = (label: string, startH: number) => ({
		label,
		strategy: 'constant',
		substrateGPerL: 100,
		rateLPerH: 0.01,
		startH
	});
	const name = `Five streams ${suffix()}`;
	const saved = await page.request.post('/api/v1/scenarios', {
		data: {
			name,
			request: {
				mode: 'fedBatch',
				kinetics: { muMaxPerH: 0.5, ksGPerL: 0.1, yieldXS: 0.5 },
				initial: { biomassGPerL: 0.5, substrateGPerL: 1, volumeL: 1 },
				feeds: [stream('A', 1), stream('B', 2), stream('C', 3), stream('D', 4), stream('E', 5)],
				endH: 10,
				outputEveryH: 0.5
			}
		}
	});
	expect(saved.status(), await saved.text()).toBe(201);

	await page.goto('/simulation');
	await page.getByLabel('μmax (1/h)').fill('0.55');
	await page.getByRole('button', { name: `Load ${name}` }).click();
	await expect(page.getByTestId('run-message')).toContainText(
		`“${name}” was not loaded. This scenario has 5 feed streams and this page edits at most 3`
	);
	await expect(page.getByLabel('μmax (1/h)')).toHaveValue('0.55');
	await expect(page.getByRole('group', { name: 'Feed stream 2' })).toHaveCount(0);
});
