// Starts the built app (`node src/cli/start.js`) on a database of the caller's choice for the HTTP
// scenarios, signs in demo accounts and times requests.
import { spawn, type ChildProcess } from 'node:child_process';
import { existsSync, mkdirSync, rmSync } from 'node:fs';
import { join, resolve } from 'node:path';
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

/**
 * Runs `use` against the build started on a fresh demo database (made for it, removed after), so
 * a scenario measures the app as a new site has it.
 */
export async function withFreshApp<T>(
	name: string,
	use: (app: RunningApp) => Promise<T>
): Promise<T> {
	const tmp = resolve('tests/.tmp');
	mkdirSync(tmp, { recursive: true });
	const databasePath = join(tmp, `bench-${name}-${process.pid}.db`);
	const app = await startApp(databasePath);
	try {
		return await use(app);
	} finally {
		app.stop();
		for (const suffix of ['', '-wal', '-shm']) rmSync(`${databasePath}${suffix}`, { force: true });
	}
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

/**
 * Median time and size (as decoded) of `runs` requests, after three to warm up; fails on any status
 * but 200. Sent as a browser would: brotli or gzip accepted.
 */
async function timeRequest(
	url: string,
	init: RequestInit & { headers: Record<string, string> },
	runs: number
): Promise<{ medianMs: number; bytes: number }> {
	const samples: number[] = [];
	let bytes = 0;
	for (let i = -2; i <= runs; i++) {
		const start = performance.now();
		const response = await fetch(url, {
			...init,
			headers: { 'accept-encoding': 'br, gzip', ...init.headers }
		});
		const body = await response.arrayBuffer();
		const ms = performance.now() - start;
		if (response.status !== 200)
			throw new Error(`${url}: ${response.status} ${new TextDecoder().decode(body).slice(0, 300)}`);
		bytes = body.byteLength;
		if (i > 0) samples.push(ms);
	}
	samples.sort((a, b) => a - b);
	return { medianMs: samples[Math.floor(samples.length / 2)], bytes };
}

export function timeGet(url: string, cookie: string, runs = 15) {
	return timeRequest(url, { headers: { cookie } }, runs);
}

export function timePost(url: string, cookie: string, body: unknown, runs = 15) {
	return timeRequest(
		url,
		{
			method: 'POST',
			headers: { cookie, 'content-type': 'application/json' },
			body: JSON.stringify(body)
		},
		runs
	);
}
