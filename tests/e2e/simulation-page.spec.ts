import { readFileSync } from 'node:fs';
import { expect, test } from './fixtures';
import { simulateMonodBatch } from './monod-run';

test.use({ role: 'engineer' });

const suffix = () => crypto.randomUUID().slice(0, 6);

test('an engineer runs a fed-batch, saves two scenarios, overlays them and exports the series', async ({
	page
}) => {
	await page.goto('/simulation');
	await expect(page.getByTestId('simulation-caveats')).toContainText('model');
	await expect(page.getByTestId('simulation-caveats')).toContainText('pressure rating');
	await expect(page.getByTestId('simulation-caveats')).toContainText('fire risk');
	await page.getByRole('button', { name: 'Run simulation' }).click();
	await expect(page.getByTestId('run-message')).toContainText('241 output points');
	for (const id of ['concentrations', 'volume', 'oxygen', 'uptake']) {
		await expect(page.getByTestId(`chart-${id}`).locator('canvas')).toBeVisible();
	}
	await expect(page.getByTestId('chart-uptake').locator('canvas')).toHaveAttribute(
		'data-series',
		'OUR | Maximum OTR (kLa·C*)'
	);
	await expect(page.getByTestId('events-table')).toContainText('Feed started');
	await expect(page.getByTestId('events-table')).toContainText('Oxygen-limited');

	const first = `Exponential 0.2 ${suffix()}`;
	await page.getByLabel('Scenario name').fill(first);
	await page.getByRole('button', { name: 'Save current inputs' }).click();
	await expect(page.getByText(`Saved “${first}”.`)).toBeVisible();

	await page.getByLabel('Set growth rate μset (1/h)').fill('0.15');
	await page.getByRole('button', { name: 'Run simulation' }).click();
	await expect(page.getByTestId('run-message')).toContainText('Simulated');
	const second = `Exponential 0.15 ${suffix()}`;
	await page.getByLabel('Scenario name').fill(second);
	await page.getByRole('button', { name: 'Save current inputs' }).click();
	await expect(page.getByText(`Saved “${second}”.`)).toBeVisible();

	await page.getByLabel(`Compare ${first}`).check();
	await page.getByLabel(`Compare ${second}`).check();
	await page.getByRole('button', { name: 'Overlay the two picked' }).click();
	await expect(
		page.getByRole('heading', { name: `Comparison: ${first} against ${second}` })
	).toBeVisible();
	const series = page.getByTestId('chart-concentrations').locator('canvas');
	await expect(series).toHaveAttribute(
		'data-series',
		new RegExp(`${first}: Biomass X.*${second}: Biomass X`)
	);

	const downloading = page.waitForEvent('download');
	await page.getByRole('button', { name: 'Export CSV' }).click();
	const download = await downloading;
	const lines = readFileSync(await download.path(), 'utf8')
		.trim()
		.split('\n');
	expect(lines[0]).toBe(
		'scenario,t_h,biomass_g_per_l,substrate_g_per_l,product_g_per_l,volume_l,dissolved_oxygen_mg_per_l,feed_l_per_h,our_mmol_per_l_h,max_otr_mmol_per_l_h'
	);
	// Two runs of 0–24 h every 0.1 h: 241 output times each, plus the header.
	expect(lines).toHaveLength(1 + 2 * 241);
	expect(lines[1].startsWith(`${first},0,`)).toBe(true);

	await page.getByRole('button', { name: `Load ${first}` }).click();
	await expect(page.getByLabel('Set growth rate μset (1/h)')).toHaveValue('0.2');
});

test('bad input shows the error at the field and keeps every value typed', async ({ page }) => {
	await page.goto('/simulation');
	await page.getByLabel('μmax (1/h)').fill('-1');
	await page.getByLabel('Ks (g/L)').fill('0.07');
	await page.getByRole('button', { name: 'Run simulation' }).click();
	await expect(page.getByLabel('μmax (1/h)')).toHaveAccessibleDescription(
		/^μmax must be greater than 0/
	);
	await expect(page.getByLabel('μmax (1/h)')).toHaveValue('-1');
	await expect(page.getByLabel('Ks (g/L)')).toHaveValue('0.07');

	await page.getByLabel('μmax (1/h)').fill('0.6');
	await page.getByLabel('Set growth rate μset (1/h)').fill('0.9');
	await page.getByRole('button', { name: 'Run simulation' }).click();
	await expect(page.getByLabel('Set growth rate μset (1/h)')).toHaveAccessibleDescription(
		/^Feed μset \(0\.9 \/h\) must be below μmax \(0\.6 \/h\)/
	);

	await page.getByLabel('Feeding strategy').selectOption('expression');
	await page.getByLabel('Feed rate expression F (L/h)').fill('0.1 * t + pump');
	await page.getByRole('button', { name: 'Run simulation' }).click();
	await expect(page.getByLabel('Feed rate expression F (L/h)')).toHaveAccessibleDescription(
		/Unknown name "pump"/
	);
	await expect(page.getByLabel('Feed rate expression F (L/h)')).toHaveValue('0.1 * t + pump');

	await page.getByLabel('End time (h)').fill('soon');
	await page.getByRole('button', { name: 'Run simulation' }).click();
	await expect(page.getByLabel('End time (h)')).toHaveAccessibleDescription(
		'End time (h): “soon” is not a number.'
	);
	await expect(page.getByLabel('End time (h)')).toBeFocused();
});

test('deleting a scenario asks first, and keeping it keeps it', async ({ page }) => {
	await page.goto('/simulation');
	const name = `To delete ${suffix()}`;
	await page.getByLabel('Scenario name').fill(name);
	await page.getByRole('button', { name: 'Save current inputs' }).click();
	await expect(page.getByText(`Saved “${name}”.`)).toBeVisible();
	await page.getByRole('button', { name: `Delete ${name}` }).click();
	const dialog = page.getByRole('dialog', { name: `Delete “${name}”?` });
	await dialog.getByRole('button', { name: 'Keep it' }).click();
	await expect(dialog).toBeHidden();
	await expect(page.getByRole('button', { name: `Delete ${name}` })).toBeVisible();
	await page.getByRole('button', { name: `Delete ${name}` }).click();
	await dialog.getByRole('button', { name: 'Delete scenario' }).click();
	await expect(page.getByText(`Deleted “${name}”.`)).toBeVisible();
	await expect(page.getByRole('button', { name: `Delete ${name}` })).toHaveCount(0);
});

test('the chemostat tab shows the steady state, the sweep and the productivity lost to the margin', async ({
	page
}) => {
	await page.goto('/simulation/continuous');
	await page.getByRole('button', { name: 'Calculate steady state' }).click();
	// D = 0.4, μmax 0.6, Ks 0.05, Sf 20: S = Ks·D/(μmax − D) = 0.1 g/L (Herbert, Elsworth & Telling 1956).
	await expect(page.getByTestId('chemostat-result')).toContainText('0.100 g/L');
	await expect(page.getByTestId('productivity-lost')).toHaveText(/\d+\.\d %/);
	await expect(page.getByTestId('chart-chemostat').locator('canvas')).toHaveAttribute(
		'aria-label',
		/D_opt 0\.570.*D_crit 0\.599/
	);
	await page.getByLabel('Safety margin below D_crit (%)').fill('150');
	await page.getByRole('button', { name: 'Calculate steady state' }).click();
	await expect(page.getByLabel('Safety margin below D_crit (%)')).toHaveAccessibleDescription(
		/must be at least 0 and less than 100 \(got 150\)/
	);

	await page.getByRole('button', { name: 'Compare productivities' }).click();
	await expect(page.getByTestId('productivity-ratio')).toHaveText(/^\d+(\.\d+)?$/);
});

test('the chemostat tab takes Pirt maintenance, shows its D_opt, and names a bad value by its label', async ({
	page
}) => {
	await page.goto('/simulation/continuous');
	const maintenance = page.getByLabel('Maintenance m_s (g/g/h)').first();
	await expect(maintenance).toHaveAccessibleDescription(/g substrate per g biomass per hour/);
	await page.getByLabel('Dilution rate D (1/h)').fill('0.05');
	await maintenance.fill('0.05');
	await page.getByRole('button', { name: 'Calculate steady state' }).click();
	// μmax 0.6, Ks 0.05, Yx/s 0.5, Sf 20, D 0.05, m_s 0.05: X = D·Y(Sf − S)/(D + m_s·Y) = 6.665 g/L, two
	// thirds of the 10.0 g/L without maintenance (Pirt 1965; SciPy in tests/chemistry/reference).
	await expect(page.getByTestId('chemostat-result')).toContainText('6.67 g/L');
	// D_opt with maintenance 0.5706 /h (SciPy, chemostat-maintenance.json), above 0.5699 without it.
	await expect(page.getByTestId('chart-chemostat').locator('canvas')).toHaveAttribute(
		'aria-label',
		/D_opt 0\.571.*D_crit 0\.599/
	);
	await expect(page.getByTestId('chemostat-maintenance-note')).toContainText(
		'golden-section search'
	);

	await maintenance.fill('-0.05');
	await page.getByLabel('Feed substrate Sf (g/L)').fill('25');
	await page.getByRole('button', { name: 'Calculate steady state' }).click();
	await expect(maintenance).toHaveAccessibleDescription(
		/^Maintenance m_s \(g\/g\/h\) must be at least 0 \(got -0\.05\)\./
	);
	await expect(maintenance).toHaveValue('-0.05');
	await expect(page.getByLabel('Feed substrate Sf (g/L)')).toHaveValue('25');

	const batchMaintenance = page.getByLabel('Maintenance m_s (g/g/h)').nth(1);
	await batchMaintenance.fill('lots');
	await page.getByRole('button', { name: 'Compare productivities' }).click();
	await expect(batchMaintenance).toHaveAccessibleDescription(
		'Maintenance m_s (g/g/h): “lots” is not a number.'
	);
	await expect(batchMaintenance).toHaveValue('lots');
	await batchMaintenance.fill('0.05');
	await page.getByRole('button', { name: 'Compare productivities' }).click();
	await expect(page.getByTestId('productivity-ratio')).toHaveText(/^\d+(\.\d+)?$/);
});

test('a run-data upload shows the bad row and still fits the rest', async ({ page }) => {
	// Data from the model itself (Monod 1949 batch, μmax 0.6 /h), reported as OD at 0.5 g/L per OD.
	const run = await simulateMonodBatch(page);
	const rows = run.t.map(
		(t: number, i: number) =>
			`${t},${(run.biomassGPerL[i] / 0.5).toFixed(5)},${run.substrateGPerL[i].toFixed(5)}`
	);
	rows.splice(3, 0, '1.25,n/a,9.9');
	const csv = ['time_h,OD600,glucose_g_per_l', ...rows].join('\n');

	await page.goto('/simulation/fit');
	await page
		.getByLabel('CSV file of the run (header row; time in hours)')
		.setInputFiles({ name: 'run-17.csv', mimeType: 'text/csv', buffer: Buffer.from(csv) });
	await expect(page.getByTestId('row-errors')).toContainText(
		'Line 5: biomass “n/a” is not a number'
	);
	await expect(page.getByTestId('row-summary')).toContainText(
		`${run.t.length} of ${run.t.length + 1} rows accepted; 1 excluded`
	);
	await page.getByLabel('Conversion (g/L per OD unit)').fill('0.5');
	await page.getByRole('button', { name: 'Fit growth parameters' }).click();
	await expect(page.getByTestId('fit-results')).toBeVisible();
	const mu = Number(await page.getByTestId('fit-mu-max').textContent());
	expect(Math.abs(mu - 0.6)).toBeLessThan(0.02);
	await expect(page.getByTestId('chart-fit').locator('canvas')).toHaveAttribute(
		'data-series',
		/Monod model X/
	);
	// The whole-curve parameters come with their 95 % intervals.
	for (const key of ['mu-max', 'ks', 'yield']) {
		await expect(page.getByTestId(`fit-monod-${key}-interval`)).toHaveText(
			/^[\d.e+-]+ – [\d.e+-]+$|^unbounded$/
		);
	}
	await page.getByText('How the fit works').click();
	await expect(page.getByTestId('model-help')).toContainText('steepest straight run');
});

test('a sparse run says which whole-curve parameter the data do not pin down', async ({ page }) => {
	// Noisy samples every 2 h from an independent script (tests/chemistry/reference/growth-curves.py):
	// the substrate runs out between two samples, so Ks is not determined.
	const reference = JSON.parse(
		readFileSync('tests/chemistry/reference/growth-curves.json', 'utf8')
	);
	const sparse = reference.monodFits.find((c: { label: string }) => c.label === 'every 2 h');
	const rows = sparse.timeH.map(
		(t: number, i: number) => `${t},${sparse.biomassGPerL[i]},${sparse.substrateGPerL[i]}`
	);
	await page.goto('/simulation/fit');
	await page.getByLabel('CSV file of the run (header row; time in hours)').setInputFiles({
		name: 'sparse.csv',
		mimeType: 'text/csv',
		buffer: Buffer.from(['time_h,biomass_g_per_l,glucose_g_per_l', ...rows].join('\n'))
	});
	await page.getByRole('button', { name: 'Fit growth parameters' }).click();
	await expect(page.getByTestId('fit-warnings')).toContainText(
		'Ks is not determined by these data: its 95 % interval is unbounded'
	);
	await expect(page.getByTestId('fit-monod-ks')).toContainText('poorly determined');
	await expect(page.getByTestId('fit-monod-ks-interval')).toHaveText('unbounded');
	await expect(page.getByTestId('fit-monod-mu-max')).not.toContainText('poorly determined');
});

test('run data that cannot be fitted is refused with the reason, and nothing typed is lost', async ({
	page
}) => {
	await page.goto('/simulation/fit');
	const upload = page.getByLabel('CSV file of the run (header row; time in hours)');
	// A culture that never grew: the same OD at every time.
	const flat = ['time_h,OD600', ...Array.from({ length: 8 }, (_, i) => `${i},0.250`)].join('\n');
	await upload.setInputFiles({ name: 'flat.csv', mimeType: 'text/csv', buffer: Buffer.from(flat) });
	await page.getByLabel('Conversion (g/L per OD unit)').fill('0.45');
	await page.getByRole('button', { name: 'Fit growth parameters' }).click();
	await expect(page.getByTestId('fit-message')).toContainText(
		'at every point: the culture did not grow, so there is nothing to fit. (the biomass column)'
	);
	await expect(page.getByLabel('Conversion (g/L per OD unit)')).toHaveValue('0.45');
	await expect(page.getByTestId('row-summary')).toContainText('8 of 8 rows accepted');

	// Time that goes back: the row is left out with its reason, and 3 rows are too few to fit.
	const backwards = ['time_h,OD600', '0,0.05', '1,0.1', '2,0.2', '1.5,0.3'].join('\n');
	await upload.setInputFiles({
		name: 'backwards.csv',
		mimeType: 'text/csv',
		buffer: Buffer.from(backwards)
	});
	await expect(page.getByTestId('row-errors')).toContainText(
		'Line 5: time 1.5 h does not come after 2 h'
	);
	await expect(page.getByTestId('fit-not-ready')).toHaveText(
		'At least 4 accepted rows are needed (3 accepted).'
	);
	await expect(page.getByRole('button', { name: 'Fit growth parameters' })).toBeDisabled();
});

test('a file that is not text is refused with a reason', async ({ page }) => {
	await page.goto('/simulation/fit');
	await page.getByLabel('CSV file of the run (header row; time in hours)').setInputFiles({
		name: 'run.csv',
		mimeType: 'text/csv',
		buffer: Buffer.from([0x50, 0x4b, 0x03, 0x04, 0x00, 0x00, 0x08, 0x00])
	});
	await expect(
		page.getByText('The file holds binary data, not text; export the sheet as CSV.')
	).toBeVisible();
	await page
		.getByLabel('CSV file of the run (header row; time in hours)')
		.setInputFiles({ name: 'run.png', mimeType: 'image/png', buffer: Buffer.from('x') });
	await expect(page.getByText('“run.png” is not a .csv, .tsv or .txt file.')).toBeVisible();
});
