// Starts the built app (`node src/cli/start.js`) on a database of the caller's choice for the HTTP
// scenarios, signs in demo accounts and times requests.
import { spawn, type ChildProcess } from 'node:child_process';
import { existsSync } from 'node:fs';
import { createServer } from 'node:net';

export interface RunningApp {
	origin: string;
	stop: () => void;
	/** A cookie header for a demo account. */
	signIn: (email: string) => Promise<string>;
}

async function freePort(): Promise<number> {
	return new Promise((resolve, reject) => {
		const probe = createServer();
		probe.once('error', reject);
		probe.listen(0, '127.0.0.1', () => {
			const { port } = probe.address() as { port: number };
			probe.close(() => resolve(port));
		});
	});
}

export async function startApp(databasePath: string): Promise<RunningApp> {
	if (!existsSync('build/index.js')) throw new Error('No build: run `npm run build` first.');
	const port = await freePort();
	const origin = `http://127.0.0.1:${port}`;
	const child: ChildProcess = spawn(process.execPath, ['src/cli/start.js'], {
		env: {
			...process.env,
			HOST: '127.0.0.1',
			PORT: String(port),
			ORIGIN: origin,
			DATABASE_PATH: databasePath,
			SMTP_PORT: String(await freePort()),
			DEMO: '1',
			NODE_ENV: 'production'
		},
		stdio: ['ignore', 'pipe', 'inherit']
	});
	const deadline = Date.now() + 120_000;
	for (;;) {
		if (child.exitCode !== null) throw new Error(`The app exited (${child.exitCode}) at start.`);
		const up = await fetch(`${origin}/api/v1/health`).then(
			(r) => r.ok,
			() => false
		);
		if (up) break;
		if (Date.now() > deadline) throw new Error('The app did not answer within 120 s.');
		await new Promise((r) => setTimeout(r, 250));
	}
	return {
		origin,
		stop: () => child.kill(),
		signIn: async (email) => {
			const response = await fetch(`${origin}/api/v1/session`, {
				method: 'POST',
				headers: { 'content-type': 'application/json' },
				body: JSON.stringify({ email, password: 'brothwright-demo' })
			});
			if (!response.ok) throw new Error(`Sign-in as ${email}: ${response.status}`);
			return response.headers
				.getSetCookie()
				.map((c) => c.split(';')[0])
				.join('; ');
		}
	};
}

/** Median and size of `runs` GETs (after three to warm up); fails on any status but 200. */
export async function timeGet(
	url: string,
	cookie: string,
	runs = 15
): Promise<{ medianMs: number; bytes: number }> {
	const samples: number[] = [];
	let bytes = 0;
	for (let i = -2; i <= runs; i++) {
		const start = performance.now();
		const response = await fetch(url, { headers: { cookie } });
		const body = await response.arrayBuffer();
		const ms = performance.now() - start;
		if (response.status !== 200) throw new Error(`${url}: ${response.status}`);
		bytes = body.byteLength;
		if (i > 0) samples.push(ms);
	}
	samples.sort((a, b) => a - b);
	return { medianMs: samples[Math.floor(samples.length / 2)], bytes };
}

/** Median and size of `runs` JSON POSTs (after three to warm up); fails on any status but 200. */
export async function timePost(
	url: string,
	cookie: string,
	body: unknown,
	runs = 15
): Promise<{ medianMs: number; bytes: number }> {
	const samples: number[] = [];
	let bytes = 0;
	const text = JSON.stringify(body);
	for (let i = -2; i <= runs; i++) {
		const start = performance.now();
		const response = await fetch(url, {
			method: 'POST',
			headers: { cookie, 'content-type': 'application/json', 'accept-encoding': 'br, gzip' },
			body: text
		});
		const answer = await response.arrayBuffer();
		const ms = performance.now() - start;
		if (response.status !== 200)
			throw new Error(`${url}: ${response.status} ${new TextDecoder().decode(answer)}`);
		bytes = Number(response.headers.get('content-length') ?? answer.byteLength);
		if (i > 0) samples.push(ms);
	}
	samples.sort((a, b) => a - b);
	return { medianMs: samples[Math.floor(samples.length / 2)], bytes };
}
