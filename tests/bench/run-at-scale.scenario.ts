// A 14-day run logged every 10 s (120,961 rows, ten signals: about 1.2 million points) sent as one
// CSV file to the built server, as the run page's upload does, then what the run page asks for while
// it refreshes: the analysis (the plan, the charts' thinned series, off-gas over every point) and a
// page of the data table; and the full CSV export.
import type { ScenarioFigure } from './bench';
import { withFreshApp } from './http-server';

const DAYS = 14;
const EVERY_S = 10;

// Targets (ours): an upload of this size within a minute on a 2-core machine; the page's refresh
// every 5 s needs its analysis well inside that; a table page feels immediate under 100 ms (Miller
// 1968; Card, Moran & Newell 1983, from memory).
const UPLOAD_TARGET_MS = 60_000;
const ANALYSIS_TARGET_MS = 2_500;
const TABLE_PAGE_TARGET_MS = 100;
const EXPORT_TARGET_MS = 15_000;

function fourteenDayCsv(): { text: string; rows: number } {
	const lines = [
		'time_s,do_percent,ph,temperature_c,agitation_rpm,gas_flow_l_per_min,exhaust_o2_percent,exhaust_co2_percent,volume_l,feed_volume_l,dry_weight_g_per_l'
	];
	const end = DAYS * 24 * 3600;
	let rows = 0;
	for (let t = 0; t <= end; t += EVERY_S) {
		const h = t / 3600;
		const x = Math.min(60, 0.2 * Math.exp(0.15 * h));
		const wobble = Math.sin(t * 0.0137);
		lines.push(
			[
				t,
				(60 + 10 * wobble).toFixed(1),
				(7 + 0.02 * wobble).toFixed(2),
				(37 + 0.05 * wobble).toFixed(2),
				600,
				10,
				(20.95 - 0.02 * x).toFixed(3),
				(0.04 + 0.02 * x).toFixed(3),
				(6 + h * 0.01).toFixed(3),
				(h * 0.01).toFixed(3),
				t % 14400 === 0 ? x.toFixed(3) : ''
			].join(',')
		);
		rows++;
	}
	return { text: lines.join('\n'), rows };
}

async function timed<T>(work: () => Promise<T>): Promise<[number, T]> {
	const start = performance.now();
	const result = await work();
	return [performance.now() - start, result];
}

export function scenario(): Promise<ScenarioFigure[]> {
	return withFreshApp('run-at-scale', async (app) => {
		const { origin } = app;
		const cookie = await app.signIn('engineer@demo.test');
		const studies = await fetch(`${origin}/api/v1/studies`, { headers: { cookie } });
		const { items: list } = (await studies.json()) as { items: { id: string }[] };
		const runs = await fetch(`${origin}/api/v1/runs`, { headers: { cookie } });
		const { items: existing } = (await runs.json()) as { items: { id: string }[] };
		if (!list.length || !existing.length) throw new Error('The demo has no study or run.');
		// A fresh run is needed: the demo run's data would clash. Its form is the page's; the API
		// writes only data, so the bench starts the run the way the page does.
		const form = new URLSearchParams({
			name: `Bench 14-day run ${Date.now()}`,
			studyId: list[0].id,
			startedAt: '2026-01-05T08:00',
			gasReferenceTemperatureC: '0',
			gasReferencePressureKPa: '101.325'
		});
		const created = await fetch(`${origin}/runs/new?/create`, {
			method: 'POST',
			headers: {
				cookie,
				origin,
				'content-type': 'application/x-www-form-urlencoded',
				'x-sveltekit-action': 'true'
			},
			body: form
		});
		const answer = (await created.json()) as { location?: string; type: string };
		const runId = answer.location?.split('/')[2]?.split('?')[0];
		if (!runId) throw new Error(`Could not start the bench run: ${JSON.stringify(answer)}`);

		const { text, rows } = fourteenDayCsv();
		const [uploadMs, upload] = await timed(async () => {
			const response = await fetch(`${origin}/api/v1/runs/${runId}/data?fileName=bench.csv`, {
				method: 'POST',
				headers: { cookie, 'content-type': 'text/csv' },
				body: text
			});
			return (await response.json()) as { inserted: number; detail?: string };
		});
		if (!upload.inserted) throw new Error(`The upload failed: ${upload.detail}`);
		const [analysisMs, analysis] = await timed(async () => {
			const response = await fetch(`${origin}/api/v1/runs/${runId}/analysis`, {
				headers: { cookie }
			});
			return (await response.json()) as { chart: Record<string, { timeH: number[] }> };
		});
		const [secondAnalysisMs] = await timed(() =>
			fetch(`${origin}/api/v1/runs/${runId}/analysis`, { headers: { cookie } }).then((r) =>
				r.arrayBuffer()
			)
		);
		const [pageMs] = await timed(() =>
			fetch(`${origin}/api/v1/runs/${runId}/data?page=1000&limit=50`, { headers: { cookie } }).then(
				(r) => r.arrayBuffer()
			)
		);
		const [exportMs, exported] = await timed(() =>
			fetch(`${origin}/api/v1/runs/${runId}/data?format=csv`, { headers: { cookie } }).then((r) =>
				r.text()
			)
		);
		const chartPoints = Math.max(...Object.values(analysis.chart).map((s) => s.timeH.length));
		return [
			{ name: 'Rows in the 14-day file', value: rows, unit: 'rows' },
			{ name: 'Points stored', value: upload.inserted, unit: 'points' },
			{ name: 'File size', value: Math.round(text.length / 1e5) / 10, unit: 'MB' },
			{
				name: 'Upload, check and store',
				value: Math.round(uploadMs),
				target: UPLOAD_TARGET_MS,
				unit: 'ms'
			},
			{
				name: 'Run analysis (charts, off-gas, plan)',
				value: Math.round(analysisMs),
				target: ANALYSIS_TARGET_MS,
				unit: 'ms'
			},
			{
				name: 'Run analysis, data unchanged (cached)',
				value: Math.round(secondAnalysisMs),
				target: ANALYSIS_TARGET_MS,
				unit: 'ms'
			},
			{ name: 'Most points in one chart series', value: chartPoints, unit: 'points' },
			{
				name: 'Data table page 1000',
				value: Math.round(pageMs),
				target: TABLE_PAGE_TARGET_MS,
				unit: 'ms'
			},
			{
				name: 'Full CSV export',
				value: Math.round(exportMs),
				target: EXPORT_TARGET_MS,
				unit: 'ms'
			},
			{ name: 'Rows exported', value: exported.split('\n').length - 1, unit: 'rows' }
		];
	});
}
