import { expect, test } from './fixtures';

// The loop from a vessel's measured kLa to a run held against its plan, as an engineer does it.

/**
 * A re-aeration after nitrogen stripping: C(t) = C* − (C* − C0)·e^(−kLa·t) with kLa 0.05 1/s
 * (180 1/h), C* 100 %, C0 2 %, read every 2 s for 2 minutes, with a small repeatable scatter
 * (±0.5 %) standing in for probe noise.
 */
function gassingOutCsv(): string {
	const kLaPerS = 0.05;
	const rows = ['time_s,do_percent'];
	for (let t = 0; t <= 120; t += 2) {
		const c = 100 - 98 * Math.exp(-kLaPerS * t) + 0.5 * Math.sin(t * 7.3);
		rows.push(`${t},${c.toFixed(2)}`);
	}
	return rows.join('\n');
}

/** 12 h of a culture: DO and exhaust gas every 10 minutes, dry weight and substrate every 2 h. */
function runCsv(): string {
	const rows = [
		'time_h,do_percent,gas_flow_l_per_min,exhaust_o2_percent,exhaust_co2_percent,dry_weight_g_per_l,substrate_g_per_l'
	];
	for (let minute = 0; minute <= 12 * 60; minute += 10) {
		const h = minute / 60;
		const x = 0.2 * Math.exp(0.2 * h);
		const sample = minute % 120 === 0;
		rows.push(
			[
				h.toFixed(4),
				(95 - 3 * x).toFixed(1),
				'8',
				(20.95 - 0.05 * x).toFixed(3),
				(0.04 + 0.05 * x).toFixed(3),
				sample ? x.toFixed(3) : '',
				sample ? (40 - (x - 0.2) / 0.5).toFixed(2) : ''
			].join(',')
		);
	}
	return rows.join('\n');
}

test.describe('kLa map and runs', () => {
	test.use({ role: 'engineer' });

	test('a gassing-out curve gives its kLa, and a run with data is drawn against its plan', async ({
		page
	}) => {
		await page.goto('/vessels');
		await page.getByRole('link', { name: 'Bench stirred tank BST-10' }).click();
		await page.getByRole('link', { name: 'Measure kLa' }).click();
		await expect(page.getByText(/Nitrogen stripping displaces oxygen/)).toBeVisible();
		await page.getByLabel('CSV file').setInputFiles({
			name: 'reaeration.csv',
			mimeType: 'text/csv',
			buffer: Buffer.from(gassingOutCsv())
		});
		await expect(page.getByLabel('Readings (CSV text)')).toHaveValue(/^time_s,do_percent/);
		await page.getByLabel('Stirrer speed, rpm').fill('700');
		await page.getByLabel('Gas flow, L/min').fill('9');
		await page.getByRole('button', { name: 'Fit', exact: true }).click();
		const result = page.getByTestId('kla-result');
		await expect(result).toContainText('kLa =');
		const kLaPerH = Number((await result.textContent())!.match(/kLa = ([\d.]+) 1\/h/)![1]);
		// the curve was made with 180 1/h; ±0.5 % scatter moves the fit by well under 3 %
		expect(Math.abs(kLaPerH - 180) / 180).toBeLessThan(0.03);
		await expect(result).toContainText('95 % interval');
		await expect(page.getByTestId('kla-fit-chart')).toBeVisible();
		await expect(page.getByTestId('kla-residual-chart')).toBeVisible();
		await page.getByRole('button', { name: 'Save to the kLa map' }).click();
		await expect(page.getByText('kLa point added to the map.')).toBeVisible();
		await expect(page.getByRole('table', { name: 'Measured kLa points' })).toContainText('700');
		await expect(page.getByTestId('kla-correlation')).toContainText('kLa =');

		await page.goto('/runs/new');
		await page.getByLabel('Name').fill(`E2E run ${Date.now()}`);
		await page
			.getByLabel('Plan (study)')
			.selectOption({ label: 'Yeast glycerol fed-batch, bench (demo)' });
		await page.getByRole('button', { name: 'Start the run' }).click();
		await expect(page.getByText(/Run RUN-\d{4}-\d{3} started/)).toBeVisible();

		// a released demo batch goes in as the medium, scanned (typed) and entered
		const released = await page.request.get('/api/v1/batches?state=released&limit=1');
		const { items } = (await released.json()) as { items: { number: string }[] };
		await page.getByLabel('Batch number (scan its sheet’s code)').fill(items[0].number);
		await page.keyboard.press('Enter');
		await expect(page.getByText(`Batch ${items[0].number} linked.`)).toBeVisible();
		const genealogy = page.getByRole('table', { name: 'Genealogy' });
		await expect(genealogy).toContainText(items[0].number);
		await expect(genealogy).toContainText(/L-\d{4}-\d{4}/);

		await page.getByLabel('CSV file').setInputFiles({
			name: 'run.csv',
			mimeType: 'text/csv',
			buffer: Buffer.from(runCsv())
		});
		await page.getByRole('button', { name: 'Upload' }).click();
		await expect(page.getByText(/\d+ points stored/)).toBeVisible();
		const charts = page.getByTestId('plan-vs-actual');
		await expect(charts.getByTestId('run-growth')).toBeVisible();
		await expect(charts.getByTestId('run-uptake')).toBeVisible();
		await expect(page.getByTestId('run-projection')).toContainText('Growing at μ =');
		// the first row: DO 95 − 3·0.2 = 94.4 %, dry weight 0.2 g/L, as uploaded
		const firstRow = page.getByRole('table', { name: 'Run data' }).getByRole('row').nth(1);
		await expect(firstRow).toContainText('94.4');
		await expect(firstRow).toContainText('0.2');
		await expect(page.getByTestId('learned-values')).toContainText('μmax');
	});

	test('a wrong kLa point comes off the map only with a reason', async ({ page }) => {
		await page.goto('/vessels');
		await page.getByRole('link', { name: 'Bench stirred tank BST-10' }).click();
		const table = page.getByRole('table', { name: 'Measured kLa points' });
		await expect(table).toBeVisible();
		const row = table.getByRole('row').filter({ hasText: '2026-10-05' });
		await row.getByText('Remove…').click();
		const remove = row.getByRole('button', { name: 'Remove the point of 2026-10-05' });
		await remove.click();
		// without a reason the form is not sent: the point stays
		await expect(row.getByLabel('Why (kept in the audit trail)')).toBeFocused();
		await row.getByLabel('Why (kept in the audit trail)').fill('probe not calibrated that day');
		await remove.click();
		await expect(page.getByText('kLa point removed from the map')).toBeVisible();
		// only that point goes (another test may add one to this vessel meanwhile)
		await expect(row).toHaveCount(0);
		await expect(table.getByRole('row').filter({ hasText: '2026-10-06' })).toHaveCount(1);
	});

	test('a file with a time going backwards is refused with its row, and nothing is stored', async ({
		page
	}) => {
		await page.goto('/runs/new');
		await page.getByLabel('Name').fill(`E2E bad file ${Date.now()}`);
		await page
			.getByLabel('Plan (study)')
			.selectOption({ label: 'Yeast glycerol fed-batch, bench (demo)' });
		await page.getByRole('button', { name: 'Start the run' }).click();
		await expect(page.getByText(/Run RUN-\d{4}-\d{3} started/)).toBeVisible();
		await page.getByLabel('CSV file').setInputFiles({
			name: 'bad.csv',
			mimeType: 'text/csv',
			buffer: Buffer.from('time_h,do_percent\n0,90\n1,85\n0.5,80\n2,170\n')
		});
		await page.getByRole('button', { name: 'Upload' }).click();
		await expect(page.getByText(/Nothing was stored/)).toBeVisible();
		await expect(
			page.getByText(/Row 3: time 0.5 h is not after the row before/).first()
		).toBeVisible();
		await expect(page.getByText(/Row 4, do_percent: 170 is outside/).first()).toBeVisible();
		await expect(page.getByText('No data yet')).toBeVisible();
	});
});
