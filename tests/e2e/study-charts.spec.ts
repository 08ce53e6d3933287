import type { Locator, Page } from '@playwright/test';
import { expect, test } from './fixtures';
import { simulateMonodBatch } from './monod-run';

test.use({ role: 'engineer' });

const YEAST = 'Yeast glycerol fed-batch, bench (demo)';
const BACTERIUM = 'Bacterium glucose fed-batch, pilot (demo)';

interface DrawnDataset {
	label: string;
	colour: string;
	dash: number[];
	line: boolean;
	pointStyle: string;
	axis: string;
	maxY: number | null;
	lastY: number | null;
	lastX: number | null;
}
interface DrawnMarker {
	label: string;
	kind: string;
	left: number;
	right: number;
	top: number;
}

/** What the chart drew, as its plugins wrote it on the canvas (chart-setup.ts). */
async function drawn(canvas: Locator) {
	await expect(canvas).toHaveAttribute('data-markers');
	await expect(canvas).toHaveAttribute('data-datasets');
	const read = async (name: string) => JSON.parse((await canvas.getAttribute(name))!);
	return {
		datasets: (await read('data-datasets')) as DrawnDataset[],
		markers: (await read('data-markers')) as DrawnMarker[],
		area: (await read('data-chart-area')) as { left: number; right: number },
		xMin: Number(await canvas.getAttribute('data-x-min')),
		xMax: Number(await canvas.getAttribute('data-x-max')),
		yScale: await canvas.getAttribute('data-y-scale')
	};
}

const dataset = (sets: DrawnDataset[], label: string) => {
	const found = sets.find((d) => d.label === label);
	expect(found, `dataset ${label} in ${sets.map((d) => d.label).join(', ')}`).toBeTruthy();
	return found!;
};

async function openStudy(page: Page, name: string) {
	await page.goto('/studies');
	await page.getByRole('link', { name }).click();
	await expect(page.getByTestId('verdict-text')).toBeVisible();
}

test('a nutrient-capped study: the chart holds X to what N supplies and marks where it runs out', async ({
	page
}) => {
	await openStudy(page, BACTERIUM);
	await expect(page.getByTestId('limit')).toContainText('N');
	const canvas = page.getByTestId('chart-time-course').locator('canvas');
	const chart = await drawn(canvas);
	// The study runs 30 h: the time axis ends there.
	expect([chart.xMin, chart.xMax]).toEqual([0, 30]);
	const x = dataset(chart.datasets, 'X, g/L');
	const allowed = dataset(chart.datasets, 'Most X the N supplied allows, g/L');
	const carbonOnly = dataset(chart.datasets, 'X without the N limit, g/L');
	// X never rises above what N allows, and ends on it; on glucose alone it would go far past.
	expect(x.maxY!).toBeLessThanOrEqual(allowed.maxY! * (1 + 1e-9));
	expect(x.lastY!).toBeCloseTo(allowed.lastY!, 9);
	expect(carbonOnly.maxY!).toBeGreaterThan(3 * x.maxY!);
	expect(carbonOnly.dash.length).toBeGreaterThan(0);
	// The verdict's maximum supportable keeps the safety factor 1.2: what N allows at the end is 1.2 × it.
	const limitText = await page.getByTestId('limit').textContent();
	const maxSupportable = Number(/maximum supportable about\s+([\d.]+)\s+g\/L/.exec(limitText!)![1]);
	expect(allowed.lastY! / 1.2).toBeCloseTo(maxSupportable, 1);
	// Where N runs out is marked, its label inside the plot.
	const marker = chart.markers.find((m) => m.label === 'N runs out')!;
	expect(marker).toBeTruthy();
	expect(marker.left).toBeGreaterThanOrEqual(chart.area.left);
	expect(marker.right).toBeLessThanOrEqual(chart.area.right);
	await expect(page.getByTestId('caption-nutrientHold')).toContainText(
		/^N runs out at [\d.]+ h: from there X is held/
	);
	// Every nutrient line says when it runs short, or why it does not: never a bare dash.
	const cells = page.getByTestId('nutrient-table').getByTestId('runs-out');
	await expect(cells.first()).toBeVisible();
	for (const text of await cells.allTextContents()) expect(text.trim()).not.toBe('—');
	await expect(cells.filter({ hasText: 'from the start' })).not.toHaveCount(0);
	await expect(cells.filter({ hasText: 'see S in the time course' })).toHaveCount(1);
});

test('an invalid what-if clears the verdict until it can be evaluated again', async ({ page }) => {
	await openStudy(page, YEAST);
	await expect(page.getByTestId('verdict-text')).toHaveText('Supported');
	const chart = await drawn(page.getByTestId('chart-time-course').locator('canvas'));
	expect(chart.xMax).toBe(60);

	const target = page.getByLabel('Target, g/L dry biomass', { exact: true });
	await target.fill('4o');
	await expect(page.getByTestId('verdict-cleared')).toBeVisible();
	await expect(page.getByTestId('verdict')).toHaveCount(0);
	await expect(page.getByTestId('chart-time-course')).toHaveCount(0);
	await target.fill('40');
	await expect(page.getByTestId('verdict-text')).toHaveText('Supported');
	await expect(page.getByTestId('verdict-cleared')).toHaveCount(0);

	// A number the server refuses (beyond physical sense) clears it too, with the server's reason.
	await target.fill('500');
	await expect(page.getByTestId('verdict-cleared')).toBeVisible();
	await expect(page.getByText(/beyond physical sense/)).toBeVisible();
	await expect(page.getByTestId('verdict')).toHaveCount(0);
	await page.getByRole('button', { name: 'Back to the saved study' }).click();
	await expect(page.getByTestId('verdict-text')).toHaveText('Supported');
});

test('the growth-fit chart: biomass on a log axis that can be switched, measured and model apart', async ({
	page
}) => {
	// Data from the model itself (Monod 1949 batch, μmax 0.6 /h), in g/L.
	const run = await simulateMonodBatch(page);
	const rows = run.t.map(
		(t: number, i: number) =>
			`${t},${run.biomassGPerL[i].toFixed(5)},${run.substrateGPerL[i].toFixed(5)}`
	);
	await page.goto('/simulation/fit');
	await page.getByLabel('CSV file of the run (header row; time in hours)').setInputFiles({
		name: 'run.csv',
		mimeType: 'text/csv',
		buffer: Buffer.from(['time_h,biomass_g_per_l,glucose_g_per_l', ...rows].join('\n'))
	});
	await page.getByRole('button', { name: 'Fit growth parameters' }).click();
	const canvas = page.getByTestId('chart-fit').locator('canvas');
	await expect(canvas).toHaveAttribute('data-y-scale', 'logarithmic');
	const chart = await drawn(canvas);
	expect([chart.xMin, chart.xMax]).toEqual([0, 14]);
	const measured = dataset(chart.datasets, 'Substrate, measured (g/L)');
	const model = dataset(chart.datasets, 'Monod model S');
	expect(measured.line).toBe(false);
	expect(model.line).toBe(true);
	expect(measured.colour).not.toBe(model.colour);
	expect(measured.axis).toBe('y2');
	expect(measured.pointStyle).not.toBe(
		dataset(chart.datasets, 'Biomass, measured (g/L)').pointStyle
	);

	await page.getByTestId('chart-fit-log').uncheck();
	await expect(canvas).toHaveAttribute('data-y-scale', 'linear');
	await page.getByTestId('chart-fit-log').check();
	await expect(canvas).toHaveAttribute('data-y-scale', 'logarithmic');
});

test('the chemostat chart marks the chosen D, and every label stays inside the plot', async ({
	page
}) => {
	await page.goto('/simulation/continuous');
	await page.getByRole('button', { name: 'Calculate steady state' }).click();
	const chart = await drawn(page.getByTestId('chart-chemostat').locator('canvas'));
	const chosen = chart.markers.filter((m) => m.kind === 'chosen');
	expect(chosen.map((m) => m.label)).toEqual(['chosen D 0.400']);
	// D_crit = μmax·Sf/(Ks + Sf) = 0.6 × 20/20.05 = 0.599 /h (Herbert, Elsworth & Telling 1956): the sweep's end.
	expect(chart.xMax).toBeCloseTo((0.6 * 20) / 20.05, 9);
	const crit = chart.markers.find((m) => m.label.startsWith('D_crit'))!;
	expect(crit).toBeTruthy();
	for (const m of chart.markers) {
		expect(m.left, m.label).toBeGreaterThanOrEqual(chart.area.left);
		expect(m.right, m.label).toBeLessThanOrEqual(chart.area.right);
	}
});

test('the simulation page: the time axis ends with the run, and a chemostat feeds fresh medium by default', async ({
	page
}) => {
	await page.goto('/simulation');
	await page.getByRole('button', { name: 'Run simulation' }).click();
	await expect(page.getByTestId('run-message')).toContainText('Simulated');
	for (const id of ['concentrations', 'volume']) {
		const chart = await drawn(page.getByTestId(`chart-${id}`).locator('canvas'));
		expect([chart.xMin, chart.xMax], id).toEqual([0, 24]);
	}

	const substrate = page.getByLabel('Substrate in feed or fresh medium Sf (g/L)');
	await expect(substrate).toHaveValue('500');
	await expect(substrate).toHaveAccessibleDescription(/concentrated feed/);
	await page.getByLabel('Operating mode').selectOption('chemostat');
	await expect(substrate).toHaveValue(await page.getByLabel('Substrate S₀ (g/L)').inputValue());
	await expect(substrate).toHaveAccessibleDescription(
		/default S₀, the medium the vessel starts with/
	);
	await page.getByRole('button', { name: 'Run simulation' }).click();
	await expect(page.getByTestId('run-message')).toContainText('Simulated');
	await page.getByLabel('Operating mode').selectOption('fedBatch');
	await expect(substrate).toHaveValue('500');
});
