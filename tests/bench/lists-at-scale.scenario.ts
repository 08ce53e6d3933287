// Every list page and list endpoint on a database at a site's size (`npm run seed:scale` makes it:
// 100k lots, 480k ledger entries, 50k batches with 450k lines, 150k trail entries). Targets: a
// median under 50 ms (timed at the client on this machine, so it includes the local round trip)
// and under 300 KB of HTML per page. The API's lists page by cursor: a page deep in the list is
// timed beside the first one and the HTML page at the same depth by number.
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

/**
 * API lists read deep by cursor: walked to `depth` rows 200 at a time, then the next 50 timed; the
 * HTML page given is the same sort at the same depth by number (50 a page).
 */
const DEEP_BY_CURSOR: { api: string; byNumber: string; depth: number; email: string }[] = [
	{
		api: '/api/v1/lots?sort=expiresOn&dir=asc',
		byNumber: '/lots?sort=expiresOn&dir=asc&page=1001',
		depth: 50_000,
		email: 'inventory@demo.test'
	},
	{
		api: '/api/v1/lots?sort=component&dir=asc',
		byNumber: '/lots?sort=component&dir=asc&page=1001',
		depth: 50_000,
		email: 'inventory@demo.test'
	},
	{
		api: '/api/v1/batches?sort=plannedOn&dir=desc',
		byNumber: '/batches?sort=plannedOn&dir=desc&page=801',
		depth: 40_000,
		email: 'technician@demo.test'
	}
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
		for (const deep of DEEP_BY_CURSOR)
			figures.push(...(await deepPageByCursor(app.origin, cookies.get(deep.email)!, deep)));
		figures.push(...(await healthWhileExporting(app.origin, cookies.get('inventory@demo.test')!)));
		return figures;
	} finally {
		app.stop();
	}
}

/** The `next` cursor after the first `depth` rows of `api`, read 200 at a time. */
async function cursorAt(url: string, cookie: string, depth: number) {
	const start = performance.now();
	let after: string | null = null;
	for (let read = 0; read < depth;) {
		const response = await fetch(`${url}&limit=200${after === null ? '' : `&after=${after}`}`, {
			headers: { cookie }
		});
		if (response.status !== 200) throw new Error(`${url}: ${response.status}`);
		const page = (await response.json()) as { items: unknown[]; next: string | null };
		read += page.items.length;
		if (page.next === null) throw new Error(`${url}: only ${read} rows, fewer than ${depth}`);
		after = page.next;
	}
	return { after: after!, walkS: (performance.now() - start) / 1000 };
}

/** The page after `depth` rows by cursor, the first page, and the same depth by page number. */
async function deepPageByCursor(
	origin: string,
	cookie: string,
	{ api, byNumber, depth }: (typeof DEEP_BY_CURSOR)[number]
): Promise<ScenarioFigure[]> {
	const depthText = depth.toLocaleString('en');
	const { after, walkS } = await cursorAt(`${origin}${api}`, cookie, depth);
	const deep = await timeGet(`${origin}${api}&limit=50&after=${after}`, cookie);
	const first = await timeGet(`${origin}${api}&limit=50`, cookie);
	const numbered = await timeGet(`${origin}${byNumber}`, cookie);
	return [
		{
			name: `GET ${api}, 50 after ${depthText} by cursor`,
			value: deep.medianMs,
			target: 50,
			unit: 'ms'
		},
		{ name: `  the first 50 by cursor`, value: first.medianMs, unit: 'ms' },
		{ name: `  GET ${byNumber} (same depth by number)`, value: numbered.medianMs, unit: 'ms' },
		{ name: `  walk to ${depthText} by cursor, 200 a page`, value: walkS, unit: 's' }
	];
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
