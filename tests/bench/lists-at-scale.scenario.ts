// Every list page and list endpoint on a database at a site's size (`npm run seed:scale` makes it:
// 100k lots, 480k ledger entries, 50k batches with 450k lines, 150k trail entries). Targets: a
// median under 50 ms (timed at the client on this machine, so it includes the local round trip)
// and under 300 KB of HTML per page.
import { existsSync } from 'node:fs';
import { resolve } from 'node:path';
import type { ScenarioFigure } from './bench';
import { startApp, timeGet } from './http-server';

const SCALE_DB = resolve(process.env.SCALE_DATABASE_PATH ?? './data/scale.db');

/** Path, and the demo account that may open it. */
const LISTS: [string, string][] = [
	['/lots', 'inventory@demo.test'],
	['/lots?sort=expiresOn&dir=desc&page=1000', 'inventory@demo.test'],
	['/lots?q=SCALE-0999', 'inventory@demo.test'],
	['/lots?sort=onHand&dir=desc', 'inventory@demo.test'],
	['/lots?sort=component&dir=desc&page=1000', 'inventory@demo.test'],
	['/lots?status=released&sort=component&page=200', 'inventory@demo.test'],
	['/api/v1/lots', 'inventory@demo.test'],
	['/api/v1/lots?q=SL-4242', 'inventory@demo.test'],
	['/batches', 'technician@demo.test'],
	['/batches?q=B-SCALE-0123', 'technician@demo.test'],
	['/batches?sort=recipe&dir=asc&page=500', 'technician@demo.test'],
	['/api/v1/batches', 'technician@demo.test'],
	['/inventory', 'inventory@demo.test'],
	['/components', 'scientist@demo.test'],
	['/recipes', 'scientist@demo.test'],
	['/studies', 'engineer@demo.test'],
	['/admin/audit', 'admin@demo.test'],
	['/admin/audit?page=2000', 'admin@demo.test'],
	['/lots/scale-lot-5', 'inventory@demo.test'],
	['/api/v1/lots/scale-lot-5/ledger', 'inventory@demo.test'],
	['/batches/scale-batch-7', 'technician@demo.test']
];

export async function scenario(): Promise<ScenarioFigure[]> {
	if (!existsSync(SCALE_DB))
		throw new Error(`No database at ${SCALE_DB}: run \`npm run seed:scale\` first.`);
	const app = await startApp(SCALE_DB);
	try {
		const cookies = new Map<string, string>();
		const figures: ScenarioFigure[] = [];
		// One pass over every list first: a server in use has its code compiled and its pages warm.
		for (const [path, email] of LISTS) {
			if (!cookies.has(email)) cookies.set(email, await app.signIn(email));
			await timeGet(`${app.origin}${path}`, cookies.get(email)!, 1);
		}
		for (const [path, email] of LISTS) {
			if (!cookies.has(email)) cookies.set(email, await app.signIn(email));
			const { medianMs, bytes } = await timeGet(`${app.origin}${path}`, cookies.get(email)!);
			figures.push({ name: `GET ${path}`, value: medianMs, target: 50, unit: 'ms' });
			if (!path.startsWith('/api/'))
				figures.push({ name: `  size of ${path}`, value: bytes / 1024, target: 300, unit: 'KB' });
		}
		figures.push(...(await healthWhileExporting(app.origin, cookies.get('inventory@demo.test')!)));
		return figures;
	} finally {
		app.stop();
	}
}

/**
 * The whole ledger (480,000 entries) downloaded as CSV while health is sampled: the export streams
 * a keyset chunk per turn of the event loop, so the server keeps answering.
 */
async function healthWhileExporting(origin: string, cookie: string): Promise<ScenarioFigure[]> {
	const start = performance.now();
	let done = false;
	const download = fetch(`${origin}/lots/ledger.csv`, {
		headers: { cookie, 'accept-encoding': 'br' }
	}).then(async (response) => {
		if (response.status !== 200) throw new Error(`ledger.csv: ${response.status}`);
		const bytes = (await response.arrayBuffer()).byteLength;
		done = true;
		return bytes;
	});
	const samples: number[] = [];
	while (!done) {
		const t = performance.now();
		await (await fetch(`${origin}/api/v1/health`)).arrayBuffer();
		samples.push(performance.now() - t);
		await new Promise((resolve) => setTimeout(resolve, 5));
	}
	const bytes = await download;
	samples.sort((a, b) => a - b);
	return [
		{
			name: 'GET /lots/ledger.csv, whole ledger (s)',
			value: (performance.now() - start) / 1000,
			unit: 's'
		},
		{ name: '  size of the CSV', value: bytes / 1024 / 1024, unit: 'MB' },
		{
			// The budget of a list page: with two cores shared by the export, its compression and
			// this client's decompression, a check should still wait no longer than a page would.
			name: `  health p99 while it streams (${samples.length} samples)`,
			value: samples[Math.min(samples.length - 1, Math.floor(samples.length * 0.99))],
			target: 50,
			unit: 'ms'
		}
	];
}
